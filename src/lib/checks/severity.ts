/**
 * A check's vibration severity: its overall velocity placed in a zone by the limit set of the
 * asset's machine group, the support (rigid or flexible) decided from the check's own natural
 * frequencies. The same code on the tablet and on the server.
 */
import {
	evaluateSeverity,
	type SeverityResult,
	type Support,
	type ZoneLimits
} from '../vibration/severity.ts';
import type { SeverityLimitRow } from '../rules/severity-limits.ts';

export interface AssetForSeverity {
	machineGroup: string | null;
	minRpm: number;
	maxRpm: number;
	nominalRpm: number | null;
}

export type SeverityOutcome =
	({ status: 'zoned' } & SeverityResult) | { status: 'no-group' | 'no-limits'; message: string };

export function checkSeverity(
	asset: AssetForSeverity,
	limits: readonly Pick<SeverityLimitRow, 'machineGroup' | 'support' | keyof ZoneLimits>[],
	measuredRpm: number | null,
	naturalHz: readonly number[],
	velocityMmS: number
): SeverityOutcome {
	if (!asset.machineGroup)
		return {
			status: 'no-group',
			message: 'No machine group is set for this asset: set it on the asset sheet to get a zone.'
		};
	const of = (support: Support) =>
		limits.find((l) => l.machineGroup === asset.machineGroup && l.support === support);
	const rigid = of('rigid');
	const flexible = of('flexible');
	if (!rigid || !flexible)
		return {
			status: 'no-limits',
			message: `No severity limits for ${asset.machineGroup}: an admin or supervisor sets them under Severity limits.`
		};
	const rpm = measuredRpm ?? asset.nominalRpm ?? asset.maxRpm;
	return {
		status: 'zoned',
		...evaluateSeverity({ velocityMmS, rpm, naturalHz, limits: { rigid, flexible } })
	};
}
