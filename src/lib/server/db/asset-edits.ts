/**
 * Edits to assets and their excitation sources (supervisors and admins). Each edit takes a new
 * sync version (the asset is sent again to the tablets), is audited with before and after, and
 * re-evaluates the asset's board row — all in one transaction.
 */
import { rezoneAsset } from './severity.ts';
import { REVIEW_WITHDRAW_MS } from '../../schemas/asset.ts';
import { and, eq } from 'drizzle-orm';
import { db } from './index.ts';
import { assets, checks, excitationSources, ruleSets } from './schema.ts';
import { nextVersion } from './versions.ts';
import { refreshAsset } from './status.ts';
import * as audit from './audit.ts';
import type { AssetForm } from '../../schemas/asset.ts';
import type { Tx } from './client.ts';

function changed<T extends Record<string, unknown>>(before: T, after: Partial<T>) {
	const b: Record<string, unknown> = {};
	const a: Record<string, unknown> = {};
	for (const k of Object.keys(after)) {
		if (JSON.stringify(before[k]) !== JSON.stringify(after[k])) {
			b[k] = before[k];
			a[k] = after[k];
		}
	}
	return { before: b, after: a, any: Object.keys(a).length > 0 };
}

/** A review of a check that is not (or no longer) on this asset. */
export class UnknownCheckError extends Error {
	constructor() {
		super('No such check on this asset.');
	}
}

export class UnknownRuleSetError extends Error {
	constructor() {
		super('Rule set: choose one from the list (that one does not exist, or was just removed).');
	}
}

export function updateAsset(
	id: string,
	form: AssetForm,
	actorId: string,
	now = Date.now()
): boolean {
	return db.transaction((tx) => {
		const before = tx.select().from(assets).where(eq(assets.id, id)).get();
		if (!before) throw new Error('No such asset.');
		if (
			form.ruleSetId &&
			!tx.select({ id: ruleSets.id }).from(ruleSets).where(eq(ruleSets.id, form.ruleSetId)).get()
		)
			throw new UnknownRuleSetError();
		const diff = changed(
			before as unknown as Record<string, unknown>,
			form as unknown as Record<string, unknown>
		);
		if (!diff.any) return false;
		tx.update(assets)
			.set({ ...form, version: nextVersion(tx), updatedAt: now })
			.where(eq(assets.id, id))
			.run();
		audit.by(tx, actorId, now)('asset', id, 'update', { before: diff.before, after: diff.after });
		// a new machine group (or speed range) can change the latest check's zone
		rezoneAsset(tx, id, now);
		return true;
	});
}

/** An excitation source of this asset, or an error. */
function sourceOfAsset(tx: Tx, assetId: string, sourceId: string) {
	const s = tx
		.select()
		.from(excitationSources)
		.where(and(eq(excitationSources.id, sourceId), eq(excitationSources.assetId, assetId)))
		.get();
	if (!s) throw new Error('No such excitation source on this asset.');
	return s;
}

/**
 * What follows every edit of a source: the asset takes a new version (the tablets fetch it
 * again), the edit is audited (with the asset in it, so the asset's log finds it), and the
 * asset's board row is evaluated again.
 */
function sourceEdited(
	tx: Tx,
	assetId: string,
	sourceId: string,
	action: string,
	change: { before?: Record<string, unknown>; after?: Record<string, unknown> },
	actorId: string,
	now: number
) {
	tx.update(assets)
		.set({ version: nextVersion(tx), updatedAt: now })
		.where(eq(assets.id, assetId))
		.run();
	audit.by(tx, actorId, now)('excitation_source', sourceId, action, change);
	refreshAsset(tx, assetId, now);
}

export function updateSource(
	assetId: string,
	sourceId: string,
	label: string,
	params: Record<string, unknown>,
	actorId: string,
	now = Date.now()
): boolean {
	return db.transaction((tx) => {
		const before = sourceOfAsset(tx, assetId, sourceId);
		const diff = changed(
			{ label: before.label, params: before.params } as Record<string, unknown>,
			{ label, params }
		);
		if (!diff.any) return false;
		tx.update(excitationSources)
			.set({ label, params, version: nextVersion(tx), updatedAt: now })
			.where(eq(excitationSources.id, sourceId))
			.run();
		const change = { before: { asset: assetId, ...diff.before }, after: diff.after };
		sourceEdited(tx, assetId, sourceId, `update ${before.kind} on asset`, change, actorId, now);
		return true;
	});
}

export function addSource(
	assetId: string,
	kind: string,
	label: string,
	params: Record<string, unknown>,
	actorId: string,
	now = Date.now()
): string {
	const id = crypto.randomUUID();
	db.transaction((tx) => {
		const order = tx
			.select({ id: excitationSources.id })
			.from(excitationSources)
			.where(eq(excitationSources.assetId, assetId))
			.all().length;
		tx.insert(excitationSources)
			.values({
				id,
				assetId,
				kind,
				label,
				params,
				sortOrder: order,
				version: nextVersion(tx),
				createdAt: now,
				updatedAt: now
			})
			.run();
		const change = { after: { asset: assetId, label, params } };
		sourceEdited(tx, assetId, id, `add ${kind}`, change, actorId, now);
	});
	return id;
}

export function deleteSource(
	assetId: string,
	sourceId: string,
	actorId: string,
	now = Date.now()
): void {
	db.transaction((tx) => {
		const before = sourceOfAsset(tx, assetId, sourceId);
		tx.delete(excitationSources).where(eq(excitationSources.id, sourceId)).run();
		const change = { before: { asset: assetId, label: before.label, params: before.params } };
		sourceEdited(tx, assetId, sourceId, `remove ${before.kind}`, change, actorId, now);
	});
}

/** A check of this asset, or UnknownCheckError. */
function checkOfAsset(tx: Tx, assetId: string, checkId: string) {
	const c = tx
		.select()
		.from(checks)
		.where(and(eq(checks.id, checkId), eq(checks.assetId, assetId)))
		.get();
	if (!c) throw new UnknownCheckError();
	return c;
}

export function markReviewed(
	assetId: string,
	checkId: string,
	outcome: 'fine' | 'remarks',
	comment: string,
	actorId: string,
	now = Date.now()
): void {
	db.transaction((tx) => {
		const c = checkOfAsset(tx, assetId, checkId);
		if (c.reviewedAt !== null) throw new ReviewError('This check has been reviewed already.', 409);
		tx.update(checks)
			.set({ reviewedBy: actorId, reviewedAt: now, reviewComment: comment, reviewOutcome: outcome })
			.where(eq(checks.id, checkId))
			.run();
		audit.by(tx, actorId, now)('check', checkId, 'review', { after: { outcome, comment } });
	});
}

export class ReviewError extends Error {
	constructor(
		message: string,
		readonly status: number
	) {
		super(message);
		this.name = 'ReviewError';
	}
}

/** Withdraws a review within a day of it (supervisors and admins), on the record. */
export function withdrawReview(
	assetId: string,
	checkId: string,
	actorId: string,
	now = Date.now()
): void {
	db.transaction((tx) => {
		const c = checkOfAsset(tx, assetId, checkId);
		if (c.reviewedAt === null) throw new ReviewError('This check has no review to withdraw.', 409);
		if (now - c.reviewedAt > REVIEW_WITHDRAW_MS)
			throw new ReviewError(
				'A review can be withdrawn within a day of it; this one is older.',
				409
			);
		tx.update(checks)
			.set({ reviewedBy: null, reviewedAt: null, reviewComment: null, reviewOutcome: null })
			.where(eq(checks.id, checkId))
			.run();
		audit.by(tx, actorId, now)('check', checkId, 'review-withdrawn', {
			before: { outcome: c.reviewOutcome, comment: c.reviewComment, by: c.reviewedBy }
		});
	});
}
