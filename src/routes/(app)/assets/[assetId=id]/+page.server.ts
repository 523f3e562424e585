import * as severity from '$lib/server/db/severity';
import { error } from '@sveltejs/kit';
import type { Actions, PageServerLoad, RequestEvent } from './$types';
import { requireRole, requireUser } from '$lib/server/guard';
import * as assetQueries from '$lib/server/db/assets';
import { readableAsset } from '$lib/server/scope';
import * as checkQueries from '$lib/server/db/checks';
import * as recordingQueries from '$lib/server/db/recordings';
import * as edits from '$lib/server/db/asset-edits';
import * as audit from '$lib/server/db/audit';
import { inWords } from '$lib/server/audit-words';
import * as rules from '$lib/server/db/rule-sets';
import { computeCheck } from '$lib/checks/compute';
import { assetForm, reviewForm, sourceFormMeta, withdrawReviewForm } from '$lib/schemas/asset';
import { fieldErrors, formToObject } from '$lib/schemas/form';
import { doneAction, failAction } from '$lib/server/forms';
import { SOURCE_KINDS, sourceKind, type SourceKind } from '$lib/schemas/excitation';
import type { SessionUser } from '$lib/server/auth';
import { formFromParams, paramsFromForm } from '$lib/schemas/source-form';
import { canEditAssets, canPlan, EDITORS } from '$lib/roles';

/** A source form: its label (checked here) and the kind's own fields (`paramsFromForm`). */
function sourceFields(
	kind: SourceKind,
	raw: Record<string, unknown>,
	user: Pick<SessionUser, 'unitSystem' | 'frequencyUnit'>
) {
	const meta = sourceFormMeta.safeParse(raw);
	const p = paramsFromForm(kind, raw, user.unitSystem, user.frequencyUnit);
	if (meta.success && p.ok) return { ok: true as const, label: meta.data.label, params: p.params };
	return {
		ok: false as const,
		errors: { ...(p.ok ? {} : p.errors), ...(meta.success ? {} : fieldErrors(meta.error)) }
	};
}

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
		// today's boundaries of the asset's group, rigid (the stricter), for the level trend
		levelLimits:
			severity
				.allLimits()
				.find((l) => l.machineGroup === sheet.asset.machineGroup && l.support === 'rigid') ?? null,
		current,
		recordings: recordingQueries.forAsset(sheet.asset.id),
		ruleSets: rules.list().map((r) => ({ id: r.id, name: r.name })),
		sourceForms: sheet.sources.map((s) => ({
			id: s.id,
			kind: s.kind,
			label: s.label,
			values: SOURCE_KINDS.includes(s.kind as SourceKind)
				? formFromParams(s.kind as SourceKind, s.params, user.unitSystem, user.frequencyUnit)
				: {}
		})),
		// the asset's own changes, its sources', its checks' (reviews) and its follow-ups', in words
		audit: inWords(audit.search({ assetId: sheet.asset.id }, 100), user.frequencyUnit)
	};
};

/** The answer to a form whose excitation source is no longer on the asset. */
const sourceGone = (raw: Record<string, unknown>, action: string) =>
	failAction(404, action, String(raw.sourceId ?? ''), {
		form: 'That excitation source is no longer on this asset.'
	});

/** A review edit; its refusals become the review form's errors (a check gone is a 404). */
function reviewEdit(checkId: string, edit: () => void, done: string) {
	try {
		edit();
	} catch (e) {
		if (e instanceof edits.UnknownCheckError)
			return failAction(404, 'review', checkId, { form: e.message });
		if (e instanceof edits.ReviewError)
			return failAction(e.status, 'review', checkId, { form: e.message });
		throw e;
	}
	return doneAction('review', checkId, done);
}

export const actions: Actions = {
	updateAsset: async (event) => {
		const actor = requireRole(event, EDITORS);
		const { sheet } = loadSheet(event);
		const id = sheet.asset.id;
		const parsed = assetForm.safeParse(formToObject(await event.request.formData()));
		if (!parsed.success) return failAction(400, 'updateAsset', id, fieldErrors(parsed.error));
		let changed: boolean;
		try {
			changed = edits.updateAsset(id, parsed.data, actor.id);
		} catch (e) {
			if (e instanceof edits.UnknownRuleSetError)
				return failAction(400, 'updateAsset', id, { ruleSetId: e.message });
			throw e;
		}
		return doneAction(
			'updateAsset',
			id,
			changed ? 'Asset saved; margins recomputed.' : 'Nothing changed.'
		);
	},
	updateSource: async (event) => {
		const actor = requireRole(event, EDITORS);
		const { sheet } = loadSheet(event);
		const raw = formToObject(await event.request.formData());
		const source = sheet.sources.find((s) => s.id === raw.sourceId);
		if (!source) return sourceGone(raw, 'updateSource');
		const f = sourceFields(source.kind as SourceKind, raw, actor);
		if (!f.ok) return failAction(400, 'updateSource', source.id, f.errors);
		const changed = edits.updateSource(sheet.asset.id, source.id, f.label, f.params, actor.id);
		return doneAction(
			'updateSource',
			source.id,
			changed ? 'Saved; margins recomputed.' : 'Nothing changed.'
		);
	},
	addSource: async (event) => {
		const actor = requireRole(event, EDITORS);
		const { sheet } = loadSheet(event);
		const raw = formToObject(await event.request.formData());
		const chosen = sourceKind.safeParse(raw.kind);
		if (!chosen.success)
			return failAction(400, 'addSource', 'new', { kind: chosen.error.issues[0].message });
		const kind = chosen.data;
		const f = sourceFields(kind, raw, actor);
		if (!f.ok) return failAction(400, 'addSource', 'new', f.errors, raw);
		edits.addSource(sheet.asset.id, kind, f.label, f.params, actor.id);
		return doneAction('addSource', 'new', 'Source added; margins recomputed.');
	},
	deleteSource: async (event) => {
		const actor = requireRole(event, EDITORS);
		const { sheet } = loadSheet(event);
		const raw = formToObject(await event.request.formData());
		const source = sheet.sources.find((s) => s.id === raw.sourceId);
		if (!source) return sourceGone(raw, 'deleteSource');
		edits.deleteSource(sheet.asset.id, source.id, actor.id);
		return doneAction('deleteSource', source.id, 'Source removed.');
	},
	review: async (event) => {
		const actor = requireRole(event, EDITORS);
		const { sheet } = loadSheet(event);
		const raw = formToObject(await event.request.formData());
		const parsed = reviewForm.safeParse(raw);
		if (!parsed.success)
			return failAction(400, 'review', String(raw.checkId ?? ''), fieldErrors(parsed.error));
		const { checkId, comment, outcome } = parsed.data;
		return reviewEdit(
			checkId,
			() => edits.markReviewed(sheet.asset.id, checkId, outcome, comment, actor.id),
			outcome === 'fine' ? 'Marked reviewed, fine.' : 'Marked reviewed with remarks.'
		);
	},
	withdrawReview: async (event) => {
		const actor = requireRole(event, EDITORS);
		const { sheet } = loadSheet(event);
		const raw = formToObject(await event.request.formData());
		const parsed = withdrawReviewForm.safeParse(raw);
		if (!parsed.success)
			return failAction(400, 'review', String(raw.checkId ?? ''), fieldErrors(parsed.error));
		const { checkId } = parsed.data;
		return reviewEdit(
			checkId,
			() => edits.withdrawReview(sheet.asset.id, checkId, actor.id),
			'Review withdrawn; the check awaits a review again.'
		);
	}
};
