/**
 * Vibration severity on the server: the editable limit sets, the zone of a check (the same
 * `checkSeverity` the tablet runs), and rezoning the latest checks when limits or an asset's
 * machine group change.
 */
import { and, eq, isNotNull } from 'drizzle-orm';
import { db } from './index.ts';
import type { Tx } from './client.ts';
import { assets, checks, modes, severityLimits } from './schema.ts';
import * as audit from './audit.ts';
import { latestCheck, refreshAsset } from './status.ts';
import { limitsIn, severityOf, storedSeverity, type Read } from './severity-zone.ts';
import { checkLimits } from '../../vibration/severity.ts';
import type { SeverityLimitsInput } from '../../schemas/severity.ts';

/** Every limit row, group 1 first, rigid before flexible. */
export const allLimits = (tx: Read = db) => limitsIn(tx);

/** The latest check of an asset zoned again with today's limits and group; then its board row. */
export function rezoneAsset(tx: Tx, assetId: string, now = Date.now()): void {
	const asset = tx.select().from(assets).where(eq(assets.id, assetId)).get();
	const latest = latestCheck(tx, assetId);
	if (asset && latest && latest.overallVelocityMmS !== null) {
		const hz = tx
			.select({ f: modes.frequencyHz })
			.from(modes)
			.where(eq(modes.checkId, latest.id))
			.all()
			.map((m) => m.f);
		const o = severityOf(tx, asset, latest.measuredRpm, hz, latest.overallVelocityMmS);
		tx.update(checks).set(storedSeverity(o)).where(eq(checks.id, latest.id)).run();
	}
	refreshAsset(tx, assetId, now);
}

export class SeverityError extends Error {}

/** New boundaries for one machine group and support, audited; every zoned asset is rezoned. */
export function updateLimits(
	input: SeverityLimitsInput,
	actorId: string,
	now = Date.now()
): number {
	checkLimits(input);
	return db.transaction((tx) => {
		const where = and(
			eq(severityLimits.machineGroup, input.machineGroup),
			eq(severityLimits.support, input.support)
		);
		const before = tx.select().from(severityLimits).where(where).get();
		if (!before) throw new SeverityError('No such limit row.');
		tx.update(severityLimits)
			.set({
				abMmS: input.abMmS,
				bcMmS: input.bcMmS,
				cdMmS: input.cdMmS,
				source: input.source,
				updatedAt: now
			})
			.where(where)
			.run();
		audit.by(tx, actorId, now)(
			'severity_limits',
			`${input.machineGroup}/${input.support}`,
			'update',
			{
				before: {
					abMmS: before.abMmS,
					bcMmS: before.bcMmS,
					cdMmS: before.cdMmS,
					source: before.source
				},
				after: { abMmS: input.abMmS, bcMmS: input.bcMmS, cdMmS: input.cdMmS, source: input.source }
			}
		);
		const zoned = tx
			.selectDistinct({ id: checks.assetId })
			.from(checks)
			.innerJoin(assets, eq(assets.id, checks.assetId))
			.where(and(isNotNull(checks.overallVelocityMmS), eq(assets.machineGroup, input.machineGroup)))
			.all();
		for (const { id } of zoned) rezoneAsset(tx, id, now);
		return zoned.length;
	});
}
