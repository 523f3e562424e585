/**
 * The vibration severity limit sets Detune ships: editable values, each naming its source. They
 * are the zone boundaries of ISO 20816-3:2022 Annex A (the same as ISO 10816-3:2009) as several
 * independent public implementations quote them; Detune holds no licensed copy, so every user is
 * asked to confirm them against theirs and against the machine maker's limits before relying on
 * a zone.
 */
import type { Support, ZoneLimits } from '../vibration/severity.ts';

export const MACHINE_GROUPS = ['group1', 'group2'] as const;
export type MachineGroup = (typeof MACHINE_GROUPS)[number];

export const MACHINE_GROUP_LABELS: Record<MachineGroup, string> = {
	group1: 'Group 1: large machines, above 300 kW (electric machines with shaft height ≥ 315 mm)',
	group2: 'Group 2: medium machines, 15–300 kW (electric machines with shaft height 160–315 mm)'
};

export const SEVERITY_SOURCE =
	'ISO 20816-3:2022 Annex A (zone boundaries as quoted by public implementations; confirm against your licensed copy and the machine maker’s limits)';

export interface SeverityLimitRow extends ZoneLimits {
	machineGroup: MachineGroup;
	support: Support;
	source: string;
}

/** mm/s r.m.s., over 10–1000 Hz (2–1000 Hz at 120–600 r/min). */
export const DEFAULT_SEVERITY_LIMITS: readonly SeverityLimitRow[] = [
	{ machineGroup: 'group1', support: 'rigid', abMmS: 2.3, bcMmS: 4.5, cdMmS: 7.1 },
	{ machineGroup: 'group1', support: 'flexible', abMmS: 3.5, bcMmS: 7.1, cdMmS: 11 },
	{ machineGroup: 'group2', support: 'rigid', abMmS: 1.4, bcMmS: 2.8, cdMmS: 4.5 },
	{ machineGroup: 'group2', support: 'flexible', abMmS: 2.3, bcMmS: 4.5, cdMmS: 7.1 }
].map((r) => ({
	...r,
	machineGroup: r.machineGroup as MachineGroup,
	support: r.support as Support,
	source: SEVERITY_SOURCE
}));

/** What each zone means, in the standard's sense, in plain words. */
export const ZONE_MEANING = {
	A: 'typical of a newly commissioned machine',
	B: 'acceptable for unrestricted long-term operation',
	C: 'unsatisfactory for long-term continuous operation: plan remedial action',
	D: 'severe enough to cause damage'
} as const;
