import { error, fail } from '@sveltejs/kit';
import type { Actions, PageServerLoad, RequestEvent } from './$types';
import { requireRole, requireUser } from '$lib/server/guard';
import * as assetQueries from '$lib/server/db/assets';
import { readableAsset } from '$lib/server/scope';
import * as checkQueries from '$lib/server/db/checks';
import * as recordingQueries from '$lib/server/db/recordings';
import * as edits from '$lib/server/db/asset-edits';
import * as audit from '$lib/server/db/audit';
import * as rules from '$lib/server/db/rule-sets';
import { computeCheck } from '$lib/checks/compute';
import { assetForm } from '$lib/schemas/asset';
import { fieldErrors, formToObject } from '$lib/schemas/form';
import { SOURCE_KINDS, type SourceKind } from '$lib/schemas/excitation';
import { formFromParams, paramsFromForm } from '$lib/schemas/source-form';
import { canEditAssets, canPlan, EDITORS } from '$lib/roles';

const MAX_LABEL = 80;
const labelError = (label: string): Record<string, string> =>
	label.length > MAX_LABEL ? { label: `Label: at most ${MAX_LABEL} characters.` } : {};

function loadSheet(event: RequestEvent) {
	const user = requireUser(event);
	const sheet = readableAsset(user, event.params.assetId)
		? assetQueries.sheet(event.params.assetId)
		: null;
	if (!sheet) error(404, { message: 'No such asset on your sites.', code: 'not-found' });
	return { user, sheet };
}

export const load: PageServerLoad = (event) => {
	const { user, sheet } = loadSheet(event);
	const history = checkQueries
		.forAsset(sheet.asset.id)
		.map(({ result: _r, deviceResult: _d, ruleSnapshot, ...c }) => ({
			...c,
			rule: ruleSnapshot,
			modes: checkQueries.modesOf(c.id)
		}));
	const latest = history[0] ?? null;
	let current = null;
	if (latest) {
		try {
			const c = computeCheck(
				{ ...sheet.asset, sources: sheet.sources },
				sheet.ruleSet,
				latest.measuredRpm,
				latest.modes.map((m) => ({ frequencyHz: m.frequencyHz, dampingRatio: m.dampingRatio }))
			);
			current = {
				pairs: c.result.pairs,
				lines: c.result.lines,
				verdict: c.result.verdict,
				verdictAtSpeed: c.result.verdictAtSpeed,
				bands: c.bands,
				remedies: c.remedies,
				modes: latest.modes.map((m) => ({ frequencyHz: m.frequencyHz })),
				measuredRpm: latest.measuredRpm
			};
		} catch (e) {
			current = { error: (e as Error).message };
		}
	}
	return {
		...sheet,
		canEdit: canEditAssets(user.role),
		canPlan: canPlan(user.role),
		history,
		current,
		recordings: recordingQueries.forAsset(sheet.asset.id),
		ruleSets: rules.list().map((r) => ({ id: r.id, name: r.name })),
		sourceForms: sheet.sources.map((s) => ({
			id: s.id,
			kind: s.kind,
			label: s.label,
			values: SOURCE_KINDS.includes(s.kind as SourceKind)
				? formFromParams(s.kind as SourceKind, s.params, user.unitSystem)
				: {}
		})),
		audit: audit.forAsset(sheet.asset.id)
	};
};

export const actions: Actions = {
	updateAsset: async (event) => {
		const actor = requireRole(event, EDITORS);
		const { sheet } = loadSheet(event);
		const raw = formToObject(await event.request.formData());
		const parsed = assetForm.safeParse(raw);
		if (!parsed.success)
			return fail(400, {
				action: 'updateAsset',
				id: sheet.asset.id,
				errors: fieldErrors(parsed.error)
			});
		let changed: boolean;
		try {
			changed = edits.updateAsset(sheet.asset.id, parsed.data, actor.id);
		} catch (e) {
			if (e instanceof edits.UnknownRuleSetError)
				return fail(400, {
					action: 'updateAsset',
					id: sheet.asset.id,
					errors: { ruleSetId: e.message }
				});
			throw e;
		}
		return {
			action: 'updateAsset',
			id: sheet.asset.id,
			done: changed ? 'Asset saved; margins recomputed.' : 'Nothing changed.'
		};
	},
	updateSource: async (event) => {
		const actor = requireRole(event, EDITORS);
		const { sheet } = loadSheet(event);
		const raw = formToObject(await event.request.formData());
		const source = sheet.sources.find((s) => s.id === raw.sourceId);
		if (!source)
			return fail(404, {
				action: 'updateSource',
				id: String(raw.sourceId ?? ''),
				errors: { form: 'That excitation source is no longer on this asset.' }
			});
		const p = paramsFromForm(source.kind as SourceKind, raw, actor.unitSystem);
		const label = String(raw.label ?? '').trim();
		if (!p.ok || label.length > MAX_LABEL)
			return fail(400, {
				action: 'updateSource',
				id: source.id,
				errors: { ...(p.ok ? {} : p.errors), ...labelError(label) }
			});
		const changed = edits.updateSource(sheet.asset.id, source.id, label, p.params, actor.id);
		return {
			action: 'updateSource',
			id: source.id,
			done: changed ? 'Saved; margins recomputed.' : 'Nothing changed.'
		};
	},
	addSource: async (event) => {
		const actor = requireRole(event, EDITORS);
		const { sheet } = loadSheet(event);
		const raw = formToObject(await event.request.formData());
		const kind = String(raw.kind ?? '') as SourceKind;
		if (!SOURCE_KINDS.includes(kind))
			return fail(400, {
				action: 'addSource',
				id: 'new',
				errors: { kind: 'Choose the kind of source.' }
			});
		const p = paramsFromForm(kind, raw, actor.unitSystem);
		const label = String(raw.label ?? '').trim();
		if (!p.ok || label.length > MAX_LABEL)
			return fail(400, {
				action: 'addSource',
				id: 'new',
				errors: { ...(p.ok ? {} : p.errors), ...labelError(label) },
				kind
			});
		edits.addSource(sheet.asset.id, kind, label, p.params, actor.id);
		return { action: 'addSource', id: 'new', done: 'Source added; margins recomputed.' };
	},
	deleteSource: async (event) => {
		const actor = requireRole(event, EDITORS);
		const { sheet } = loadSheet(event);
		const raw = formToObject(await event.request.formData());
		if (!sheet.sources.some((s) => s.id === raw.sourceId))
			return fail(404, {
				action: 'deleteSource',
				id: String(raw.sourceId ?? ''),
				errors: { form: 'That excitation source is no longer on this asset.' }
			});
		edits.deleteSource(sheet.asset.id, String(raw.sourceId), actor.id);
		return { action: 'deleteSource', id: String(raw.sourceId), done: 'Source removed.' };
	},
	review: async (event) => {
		const actor = requireRole(event, EDITORS);
		const { sheet } = loadSheet(event);
		const raw = formToObject(await event.request.formData());
		const comment = String(raw.comment ?? '').trim();
		if (comment.length > 1000)
			return fail(400, {
				action: 'review',
				id: String(raw.checkId ?? ''),
				errors: { comment: 'Comment: at most 1000 characters.' }
			});
		try {
			edits.markReviewed(sheet.asset.id, String(raw.checkId ?? ''), comment, actor.id);
		} catch (e) {
			return fail(404, {
				action: 'review',
				id: String(raw.checkId ?? ''),
				errors: { form: (e as Error).message }
			});
		}
		return { action: 'review', id: String(raw.checkId), done: 'Marked reviewed.' };
	}
};
