/**
 * A check's zone from the limit rows of the database it is given: no import of the app's own
 * database, so the seed (and its command line) can zone the demo checks in the database it builds.
 */
import type { Tx } from './client.ts';
import { severityLimits } from './schema.ts';
import {
	checkSeverity,
	type AssetForSeverity,
	type SeverityOutcome
} from '../../checks/severity.ts';

export type Read = Pick<Tx, 'select'>;

/** Every limit row, group 1 first, rigid before flexible. */
export function limitsIn(tx: Read) {
	return tx
		.select()
		.from(severityLimits)
		.all()
		.sort(
			(a, b) => a.machineGroup.localeCompare(b.machineGroup) || b.support.localeCompare(a.support)
		);
}

/** The zone of a check, with how it was reached; null when no level was given. */
export function severityOf(
	tx: Read,
	asset: AssetForSeverity,
	measuredRpm: number | null,
	naturalHz: readonly number[],
	velocityMmS: number | null | undefined
): SeverityOutcome | null {
	if (velocityMmS === null || velocityMmS === undefined) return null;
	return checkSeverity(asset, limitsIn(tx), measuredRpm, naturalHz, velocityMmS);
}

/** What a check row stores of an outcome. */
export const storedSeverity = (o: SeverityOutcome | null) => ({
	severityZone: o?.status === 'zoned' ? o.zone : null,
	severity: o as Record<string, unknown> | null
});
