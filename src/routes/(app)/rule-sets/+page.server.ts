import type { Actions, PageServerLoad } from './$types';
import { requireRole, requireUser } from '$lib/server/guard';
import * as rules from '$lib/server/db/rule-sets';
import { inTurn } from '$lib/server/turns';
import { ruleSetForm } from '$lib/schemas/rule-set';
import { fieldErrors } from '$lib/schemas/form';
import { doneAction, failAction } from '$lib/server/forms';
import { SOURCE_KINDS } from '$lib/schemas/excitation';
import { EDITORS } from '$lib/roles';
import { RULE_TEMPLATES, ruleTemplate } from '$lib/rules/templates';

export const load: PageServerLoad = (event) => {
	requireUser(event);
	// ?from=<template>: the new rule set's form starts from a published rule
	return {
		ruleSets: rules.list(),
		templates: RULE_TEMPLATES.map((t) => ({ key: t.key, label: t.label })),
		template: ruleTemplate(event.url.searchParams.get('from'))
	};
};

function parse(form: FormData) {
	const perKind: Record<string, string> = {};
	for (const k of SOURCE_KINDS) {
		const v = String(form.get(`perKind.${k}`) ?? '').trim();
		if (v !== '') perKind[k] = v;
	}
	return ruleSetForm.safeParse({
		name: String(form.get('name') ?? ''),
		kind: String(form.get('kind') ?? ''),
		percent: String(form.get('percent') ?? ''),
		perKind,
		source: String(form.get('source') ?? ''),
		edition: String(form.get('edition') ?? '')
	});
}

export const actions: Actions = {
	save: async (event) => {
		const actor = requireRole(event, EDITORS);
		const form = await event.request.formData();
		const id = String(form.get('id') ?? '') || null;
		const parsed = parse(form);
		if (!parsed.success) return failAction(400, 'save', id ?? 'new', fieldErrors(parsed.error));
		try {
			const r = await inTurn(() => rules.save(id, parsed.data, actor.id));
			return doneAction(
				'save',
				id ?? 'new',
				id
					? `Saved; ${r.recomputed} asset verdict${r.recomputed === 1 ? '' : 's'} recomputed.`
					: 'Rule set created.'
			);
		} catch (e) {
			if (e instanceof rules.RuleSetError)
				return failAction(e.status, 'save', id ?? 'new', { form: e.message });
			throw e;
		}
	}
};
