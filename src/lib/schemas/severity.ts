/** Severity: the overall level typed on Floor check, and the limit-set form. */
import { z } from 'zod';
import { MACHINE_GROUPS } from '../rules/severity-limits.ts';

const mmS = (label: string) =>
	z.coerce
		.number({ error: `${label}: a number in mm/s.` })
		.finite(`${label}: a number in mm/s.`)
		.positive(`${label}: more than 0 mm/s.`)
		.max(1000, `${label}: at most 1000 mm/s.`);

/** The overall velocity typed or computed on the tablet, mm/s r.m.s. (0 allowed: a stopped machine reads 0). */
export const overallVelocity = z
	.number({ error: 'Overall velocity: a number in mm/s.' })
	.finite('Overall velocity: a number in mm/s.')
	.min(0, 'Overall velocity: 0 mm/s or more.')
	.max(1000, 'Overall velocity: at most 1000 mm/s r.m.s. (check the unit: mm/s, not µm).');

export const severityLimitsForm = z
	.object({
		machineGroup: z.enum(MACHINE_GROUPS, { error: 'Machine group: group1 or group2.' }),
		support: z.enum(['rigid', 'flexible'], { error: 'Support: rigid or flexible.' }),
		abMmS: mmS('A/B'),
		bcMmS: mmS('B/C'),
		cdMmS: mmS('C/D'),
		source: z
			.string()
			.trim()
			.min(3, 'Source: name where the values come from (standard, edition, table).')
			.max(300, 'Source: at most 300 characters.')
	})
	.strict()
	.refine((v) => v.abMmS < v.bcMmS && v.bcMmS < v.cdMmS, {
		message: 'The boundaries must rise: A/B < B/C < C/D.',
		path: ['bcMmS']
	});

export type SeverityLimitsInput = z.infer<typeof severityLimitsForm>;
