/** The asset form (supervisors and admins), shared by the sheet and the CSV import. */
import { z } from 'zod';
import { MACHINE_GROUPS } from '../rules/severity-limits.ts';
import { MACHINE_KINDS_LIST } from './shared-enums.ts';
import { decimalOrNull } from './form.ts';

const numberText = (what: string) =>
	z.preprocess(
		(v) => (typeof v === 'string' ? (decimalOrNull(v) ?? undefined) : v),
		z.number({ error: `${what}: enter a number.` }).finite(`${what}: enter a number.`)
	);
const optionalNumber = (what: string) =>
	z.preprocess(
		(v) => (typeof v === 'string' ? decimalOrNull(v) : (v ?? null)),
		z
			.number({ error: `${what}: enter a number or leave it empty.` })
			.finite()
			.nullable()
	);

export const assetForm = z
	.object({
		name: z
			.string()
			.trim()
			.min(2, 'Name: at least 2 characters.')
			.max(120, 'Name: at most 120 characters.'),
		machineKind: z.enum(MACHINE_KINDS_LIST, {
			error: `Machine: one of ${MACHINE_KINDS_LIST.join(', ')}.`
		}),
		driveType: z.enum(['fixed', 'vfd'], { error: 'Drive: fixed or vfd.' }),
		minRpm: numberText('Minimum speed').pipe(
			z
				.number()
				.positive('Minimum speed: greater than zero.')
				.max(100_000, 'Minimum speed: at most 100,000 rpm.')
		),
		maxRpm: numberText('Maximum speed').pipe(
			z
				.number()
				.positive('Maximum speed: greater than zero.')
				.max(100_000, 'Maximum speed: at most 100,000 rpm.')
		),
		nominalRpm: optionalNumber('Nominal speed').pipe(
			z.number().positive('Nominal speed: greater than zero.').nullable()
		),
		motorPoles: optionalNumber('Motor poles').pipe(
			z
				.number()
				.int('Motor poles: a whole number.')
				.min(2, 'Motor poles: at least 2.')
				.max(64)
				.refine((p) => p % 2 === 0, 'Motor poles: an even number (poles come in pairs).')
				.nullable()
		),
		slipPct: optionalNumber('Slip').pipe(
			z
				.number()
				.min(0, 'Slip: 0 % or more.')
				.max(10, 'Slip: at most 10 % (a running induction motor slips 0.5–5 %).')
				.nullable()
		),
		driveRatio: numberText('Drive ratio').pipe(
			z.number().positive('Drive ratio: greater than zero.').max(1000)
		),
		skipBands: numberText('Skip bands').pipe(
			z.number().int('Skip bands: a whole number.').min(0).max(16, 'Skip bands: at most 16.')
		),
		ruleSetId: z.preprocess((v) => (v === '' ? null : v), z.string().max(64).nullable()),
		/** the vibration severity group; empty: none (no zone); absent: unchanged */
		machineGroup: z.preprocess(
			(v) => (v === '' ? null : v),
			z
				.enum(MACHINE_GROUPS, { error: 'Machine group: group1 or group2, or leave it empty.' })
				.nullable()
				.optional()
		),
		notes: z.string().max(2000, 'Notes: at most 2000 characters.').default('')
	})
	.strict()
	// checked even when another field of the row is wrong, so one pass names every problem: the
	// speeds and the drive need only be valid themselves
	.refine((a) => a.maxRpm >= a.minRpm, {
		message: 'Maximum speed must be at least the minimum speed.',
		path: ['maxRpm'],
		when: (p) => speedsValid(p.value)
	})
	.refine((a) => a.driveType === 'vfd' || a.minRpm === a.maxRpm, {
		message: 'A fixed-speed machine has one speed: make minimum and maximum equal, or choose vfd.',
		path: ['maxRpm'],
		when: (p) =>
			speedsValid(p.value) &&
			(['fixed', 'vfd'] as unknown[]).includes((p.value as Speeds).driveType)
	});

type Speeds = { minRpm: unknown; maxRpm: unknown; driveType: unknown };
/** Whether a row's speeds parsed as numbers (the refinements above need them). */
function speedsValid(v: unknown): boolean {
	const x = v as Speeds | null;
	return (
		typeof x === 'object' &&
		x !== null &&
		typeof x.minRpm === 'number' &&
		Number.isFinite(x.minRpm) &&
		typeof x.maxRpm === 'number' &&
		Number.isFinite(x.maxRpm)
	);
}

export type AssetForm = z.infer<typeof assetForm>;

/** The parts of a source form that are not the kind's own fields (those: `source-form.ts`). */
export const sourceFormMeta = z.object({
	sourceId: z.string().max(64).optional(),
	kind: z.string().max(32).optional(),
	label: z.string().trim().max(80, 'Label: at most 80 characters.').default('')
});

/** A reviewer's mark on a check, with an optional comment. */
/**
 * A review: "fine" (a comment optional) or "with remarks" (the comment says what). Before, an
 * empty comment marked a check reviewed in one tap.
 */
/** The check a review is withdrawn from. */
export const withdrawReviewForm = z.object({ checkId: z.string().min(1, 'Which check?').max(64) });

export const reviewForm = z
	.object({
		checkId: z.string().min(1, 'Which check?').max(64),
		outcome: z.enum(['fine', 'remarks'], { error: 'Choose: reviewed, fine, or with remarks.' }),
		comment: z.string().trim().max(1000, 'Comment: at most 1000 characters.').default('')
	})
	.strict()
	.refine((r) => r.outcome === 'fine' || r.comment.length >= 3, {
		message: 'Comment: say what the remarks are (at least 3 characters).',
		path: ['comment']
	});

/** A review may be withdrawn by a supervisor or admin within this long of it. */
export const REVIEW_WITHDRAW_MS = 24 * 3600 * 1000;
