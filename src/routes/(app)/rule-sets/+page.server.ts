import type { Actions, PageServerLoad } from './$types';
import { requireRole, requireUser } from '$lib/server/guard';
import * as rules from '$lib/server/db/rule-sets';
import { inTurn } from '$lib/server/turns';
import { parseRuleSetSave, ruleSetsQuery } from '$lib/schemas/rule-set';
import { fieldErrors, formToObject, queryToObject } from '$lib/schemas/form';
import { doneAction, failAction } from '$lib/server/forms';
import { EDITORS } from '$lib/roles';
import { RULE_TEMPLATES, ruleTemplate } from '$lib/rules/templates';

export const load: PageServerLoad = (event) => {
	requireUser(event);
	// ?from=<template>: the new rule set's form starts from a published rule
	return {
		ruleSets: rules.list(),
		templates: RULE_TEMPLATES.map((t) => ({ key: t.key, label: t.label })),
		template: ruleTemplate(ruleSetsQuery.parse(queryToObject(event.url.searchParams)).from)
	};
};

export const actions: Actions = {
	save: async (event) => {
		const actor = requireRole(event, EDITORS);
		const posted = parseRuleSetSave(formToObject(await event.request.formData()));
		if (!posted.id.success) return failAction(400, 'save', 'new', fieldErrors(posted.id.error));
		const id = posted.id.data;
		const parsed = posted.form;
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
