/**
 * Push: a batch of checks from a tablet, answered per item.
 * 1. Each item is parsed on its own: a malformed item is rejected with the reason, the rest go on.
 * 2. A check whose UUID the server already holds is a duplicate: acknowledged, nothing stored.
 * 3. The asset must be on one of the user's sites, and a replaced check must exist.
 * 4. The server recomputes margins and verdicts with the same engine and stores its result as the
 *    one of record; where the device showed something else, both are kept and the difference logged.
 * 5. All of it in one synchronous transaction. An unexpected error stops the batch there: the items
 *    already applied are committed and reported, the rest are left for the client to retry.
 */
import { eq } from 'drizzle-orm';
import { db } from '../db/index.ts';
import { assets, checks, excitationSources, modes, recordings, ruleSets } from '../db/schema.ts';
import { analysesDiffer, type StoredAnalysis } from '../recordings.ts';
import { afterCheck } from '../db/status.ts';
import { retestedBy } from '../db/follow-ups.ts';
import { inScope, visibleSiteIds } from '../db/assets.ts';
import { computeCheck, sameSummary } from '../../checks/compute.ts';
import { checkPush, type ItemResult, type PushResponse } from '../../schemas/sync.ts';
import type { Role } from '../../roles.ts';
import type { Tx } from '../db/client.ts';

export interface PushOptions {
	/** test hook (only with DETUNE_TEST_FAULTS=1): throw at this 1-based item */
	failAtItem?: number | null;
	/**
	 * test hook (only with DETUNE_TEST_FAULTS=1): at this 1-based item, with the items before it
	 * written but not committed, say so on stdout and block, so that a test can kill the server
	 * mid-batch
	 */
	holdAtItem?: number | null;
	now?: number;
}

export function push(
	user: { id: string; role: Role; name?: string },
	items: unknown[],
	options: PushOptions = {}
): { response: PushResponse; failed: boolean } {
	const results: ItemResult[] = [];
	let error: string | undefined;
	const scope = visibleSiteIds(user);
	const now = options.now ?? Date.now();
	db.transaction((tx) => {
		for (let index = 0; index < items.length; index++) {
			try {
				if (options.failAtItem === index + 1)
					throw new Error(`fault injected at item ${index + 1}`);
				if (options.holdAtItem === index + 1) holdForKill(index + 1);
				results.push(applyOne(tx, user, scope, items[index], now));
			} catch (e) {
				error = `The server failed on item ${index + 1}; it and the items after it were not stored. Retry later.`;
				console.error('[detune] push stopped:', (e as Error).message);
				break;
			}
		}
	});
	return { response: error ? { results, error } : { results }, failed: error !== undefined };
}

function holdForKill(item: number): void {
	console.log(`[detune] test fault: batch held open at item ${item}`);
	Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, 60_000);
}

function applyOne(
	tx: Tx,
	user: { id: string; name?: string },
	scope: string[] | 'all',
	raw: unknown,
	now: number
): ItemResult {
	const parsed = checkPush.safeParse(raw);
	const rawId =
		typeof raw === 'object' && raw !== null && typeof (raw as { id?: unknown }).id === 'string'
			? ((raw as { id: string }).id as string).slice(0, 64)
			: null;
	if (!parsed.success) {
		const issue = parsed.error.issues[0];
		return {
			id: rawId,
			status: 'rejected',
			reason: `${issue.path.join('.') || 'item'}: ${issue.message}`
		};
	}
	const c = parsed.data;
	if (tx.select({ id: checks.id }).from(checks).where(eq(checks.id, c.id)).get())
		return { id: c.id, status: 'duplicate' };
	const asset = tx.select().from(assets).where(eq(assets.id, c.assetId)).get();
	if (!asset || !inScope(scope, asset.siteId))
		return {
			id: c.id,
			status: 'rejected',
			reason: 'The asset does not exist or is not on your sites.'
		};
	if (
		c.replacesCheckId &&
		!tx.select({ id: checks.id }).from(checks).where(eq(checks.id, c.replacesCheckId)).get()
	) {
		return { id: c.id, status: 'rejected', reason: 'The check it replaces is not on the server.' };
	}
	for (const r of c.recordings ?? []) {
		const row = tx.select().from(recordings).where(eq(recordings.id, r.id)).get();
		if (!row || row.assetId !== asset.id)
			return {
				id: c.id,
				status: 'rejected',
				reason: `Recording ${r.id} has not been uploaded for this asset.`
			};
	}
	const sources = tx
		.select()
		.from(excitationSources)
		.where(eq(excitationSources.assetId, asset.id))
		.all();
	const rule = asset.ruleSetId
		? (tx.select().from(ruleSets).where(eq(ruleSets.id, asset.ruleSetId)).get() ?? null)
		: null;
	let computed;
	try {
		computed = computeCheck({ ...asset, sources }, rule, c.measuredRpm, c.modes);
	} catch (e) {
		return {
			id: c.id,
			status: 'rejected',
			reason: `The check cannot be computed: ${(e as Error).message}`
		};
	}
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
	c.modes.forEach((m) => {
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
	});
	if (s.verdict === 'clear') retestedBy(tx, asset.id, c.id, c.checkedAt, now);
	afterCheck(
		tx,
		asset.id,
		{ id: c.id, checkedAt: c.checkedAt, measuredRpm: c.measuredRpm, userName: user.name ?? null },
		s,
		now
	);
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
	return { id: c.id, status: 'applied', verdict: s.verdict };
}
