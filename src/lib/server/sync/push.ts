/**
 * Push: a batch of checks from a tablet, answered per item.
 * 1. Each item is parsed on its own: a malformed item is rejected with the reason, the rest go on.
 * 2. A check whose UUID the server already holds is a duplicate: acknowledged, nothing stored.
 * 3. The check's author is the session's user: an item that names another author is refused, so a
 *    shared tablet can never file one technician's check under another's name.
 * 4. The asset must be on one of the user's sites, and a replaced check must exist.
 * 5. The server recomputes margins and verdicts with the same engine and stores its result as the
 *    one of record; where the device showed something else, both are kept and the difference logged.
 * 6. The batch is one synchronous transaction and each item a savepoint inside it: an item is
 *    stored whole or not at all. An unexpected error rolls that item back and stops the batch there;
 *    the items before it are committed and reported, the rest are left for the client to retry.
 */
import { eq } from 'drizzle-orm';
import { db } from '../db/index.ts';
import { checks, modes, recordings } from '../db/schema.ts';
import { analysesDiffer, type StoredAnalysis } from '../recordings.ts';
import { afterCheck } from '../db/status.ts';
import { retestedBy } from '../db/follow-ups.ts';
import { inScope, visibleSiteIds } from '../db/assets.ts';
import { withSourcesAndRule } from '../db/asset-with-rule.ts';
import { computeCheck, sameSummary, type ComputedCheck } from '../../checks/compute.ts';
import {
	checkPush,
	type CheckPush,
	type ItemResult,
	type PushResponse
} from '../../schemas/sync.ts';
import type { Role } from '../../roles.ts';
import type { Db } from '../db/client.ts';
import { pushProbe } from './probe.ts';
import { severityOf, storedSeverity } from '../db/severity-zone.ts';
import type { SeverityOutcome } from '../../checks/severity.ts';
import { readableAsset, readableCheck } from '../scope.ts';

/** The batch transaction: it can open a savepoint per item. */
type BatchTx = Parameters<Parameters<Db['transaction']>[0]>[0];
type Found = NonNullable<ReturnType<typeof withSourcesAndRule>>;
type Pusher = { id: string; role: Role; name?: string };

export interface PushOptions {
	now?: number;
}

export function push(
	user: { id: string; role: Role; name?: string },
	items: unknown[],
	options: PushOptions = {}
): { response: PushResponse; failed: boolean; closedFollowUps: string[] } {
	const results: ItemResult[] = [];
	const closedFollowUps: string[] = [];
	let error: string | undefined;
	const scope = visibleSiteIds(user);
	const now = options.now ?? Date.now();
	const probe = pushProbe();
	db.transaction((tx) => {
		for (let index = 0; index < items.length; index++) {
			try {
				probe?.({ item: index + 1, phase: 'before-item', checkId: rawIdOf(items[index]) });
				// a savepoint: whatever this item wrote goes if any step of it throws
				const closing: string[] = [];
				results.push(
					tx.transaction((sp) => applyOne(sp, user, scope, items[index], now, index, closing))
				);
				closedFollowUps.push(...closing);
			} catch (e) {
				error = `The server failed on item ${index + 1}; it and the items after it were not stored. Retry later.`;
				console.error('[detune] push stopped:', (e as Error).message);
				break;
			}
		}
	});
	return {
		response: error ? { results, error } : { results },
		failed: error !== undefined,
		closedFollowUps
	};
}

function rawIdOf(raw: unknown): string | null {
	return typeof raw === 'object' && raw !== null && typeof (raw as { id?: unknown }).id === 'string'
		? (raw as { id: string }).id.slice(0, 64)
		: null;
}

const rejected = (id: string | null, reason: string): ItemResult => ({
	id,
	status: 'rejected',
	reason
});

function applyOne(
	tx: BatchTx,
	user: Pusher,
	scope: string[] | 'all',
	raw: unknown,
	now: number,
	index: number,
	/** follow-ups this check closes as retested (for the messages after the commit) */
	closed?: string[]
): ItemResult {
	const parsed = checkPush.safeParse(raw);
	if (!parsed.success) {
		const issue = parsed.error.issues[0];
		return rejected(rawIdOf(raw), `${issue.path.join('.') || 'item'}: ${issue.message}`);
	}
	const c = parsed.data;
	if (c.authorId && c.authorId !== user.id)
		return rejected(
			c.id,
			'This check was recorded by another user on this tablet; it syncs when they sign in.'
		);
	const held = tx.select({ assetId: checks.assetId }).from(checks).where(eq(checks.id, c.id)).get();
	// a duplicate only of a check this user may read: another site's id is not acknowledged
	if (held)
		return readableAsset(user, held.assetId, tx)
			? { id: c.id, status: 'duplicate' }
			: rejected(c.id, 'This check id is taken; the tablet makes a new one for a new check.');
	const found = withSourcesAndRule(tx, c.assetId);
	if (!found || !inScope(scope, found.asset.siteId))
		return rejected(c.id, 'The asset does not exist or is not on your sites.');
	const refused = refusedReference(tx, user, c, found.asset.id);
	if (refused) return rejected(c.id, refused);
	let computed: ComputedCheck;
	try {
		computed = computeCheck(
			{ ...found.asset, sources: found.sources },
			found.ruleSet,
			c.measuredRpm,
			c.modes
		);
	} catch (e) {
		return rejected(c.id, `The check cannot be computed: ${(e as Error).message}`);
	}
	const severity = severityOf(
		tx,
		found.asset,
		c.measuredRpm,
		c.modes.map((m) => m.frequencyHz),
		c.overallVelocityMmS
	);
	insertCheck(tx, user, c, found, computed, severity, now);
	pushProbe()?.({ item: index + 1, phase: 'after-insert', checkId: c.id });
	const s = computed.summary;
	if (s.verdict === 'clear')
		closed?.push(...retestedBy(tx, found.asset.id, c.id, c.checkedAt, c.modes, now));
	afterCheck(
		tx,
		found.asset.id,
		{ id: c.id, checkedAt: c.checkedAt, measuredRpm: c.measuredRpm, userName: user.name ?? null },
		s,
		now
	);
	linkRecordings(tx, c);
	return { id: c.id, status: 'applied', verdict: s.verdict };
}

/**
 * Why a check's references cannot be accepted, or null: the check it replaces must be one of the
 * same asset, and every recording it or its modes name must be a recording of this asset.
 */
function refusedReference(tx: BatchTx, user: Pusher, c: CheckPush, assetId: string): string | null {
	if (c.replacesCheckId) {
		const replaced = readableCheck(user, c.replacesCheckId, tx);
		if (!replaced || replaced.assetId !== assetId)
			return 'The check it replaces is not a check of this asset on the server.';
	}
	const named = new Set([
		...(c.recordings ?? []).map((r) => r.id),
		...c.modes.flatMap((m) => (m.recordingId ? [m.recordingId] : []))
	]);
	for (const id of named) {
		const row = tx.select().from(recordings).where(eq(recordings.id, id)).get();
		if (!row || row.assetId !== assetId)
			return `Recording ${id} has not been uploaded for this asset.`;
	}
	return null;
}

function insertCheck(
	tx: BatchTx,
	user: Pusher,
	c: CheckPush,
	{ asset, ruleSet: rule }: Found,
	computed: ComputedCheck,
	severity: SeverityOutcome | null,
	now: number
): void {
	const s = computed.summary;
	const differs = !sameSummary(c.device, s);
	if (differs)
		console.warn(
			`[detune] check ${c.id}: device showed ${JSON.stringify(c.device)}, server computed ${JSON.stringify({ verdict: s.verdict, verdictAtSpeed: s.verdictAtSpeed })}`
		);
	tx.insert(checks)
		.values({
			id: c.id,
			assetId: asset.id,
			userId: user.id,
			checkedAt: c.checkedAt,
			receivedAt: now,
			measuredRpm: c.measuredRpm,
			driveSetpointHz: c.driveSetpointHz,
			overallVelocityMmS: c.overallVelocityMmS ?? null,
			...storedSeverity(severity),
			notes: c.notes,
			replacesCheckId: c.replacesCheckId,
			ruleSetId: asset.ruleSetId,
			ruleSnapshot: {
				...computed.rule,
				name: rule?.name ?? 'Detune default ±10 %',
				source: rule?.source ?? 'Common practice',
				edition: rule?.edition ?? ''
			},
			verdict: s.verdict,
			verdictAtSpeed: s.verdictAtSpeed,
			worstMarginAtSpeedPct: s.worstMarginAtSpeedPct,
			worstMarginOverRangePct: s.worstMarginOverRangePct,
			worstPair: s.worstPair,
			worstNaturalHz: s.worstNaturalHz,
			worstLabel: s.worstLabel,
			result: {
				pairs: computed.result.pairs,
				envelope: computed.result.envelope,
				bands: computed.bands.bands,
				warnings: computed.bands.warnings,
				remedies: computed.remedies
			} as unknown as Record<string, unknown>,
			deviceResult: differs ? (c.device as unknown as Record<string, unknown>) : null,
			resultDiffers: differs
		})
		.run();
	for (const m of c.modes)
		tx.insert(modes)
			.values({
				id: crypto.randomUUID(),
				checkId: c.id,
				frequencyHz: m.frequencyHz,
				dampingRatio: m.dampingRatio,
				direction: m.direction,
				location: m.location,
				origin: m.origin,
				recordingId: m.recordingId ?? null
			})
			.run();
}

/** The check's bump-test files now belong to it; the device's peaks are kept beside the server's. */
function linkRecordings(tx: BatchTx, c: CheckPush): void {
	for (const r of c.recordings ?? []) {
		const row = tx.select().from(recordings).where(eq(recordings.id, r.id)).get()!;
		const differs = analysesDiffer(
			row.analysis as unknown as StoredAnalysis,
			r.deviceFrequenciesHz
		);
		if (differs)
			console.warn(
				`[detune] recording ${r.id}: device peaks ${r.deviceFrequenciesHz.map((f) => f.toFixed(2)).join(', ')} Hz differ from the server's analysis`
			);
		tx.update(recordings)
			.set({
				checkId: c.id,
				deviceAnalysis: { frequenciesHz: r.deviceFrequenciesHz },
				analysisDiffers: differs
			})
			.where(eq(recordings.id, r.id))
			.run();
	}
}
