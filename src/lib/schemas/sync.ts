/**
 * The sync protocol's payloads, shared by the tablet and the server (documented in DEVELOPERS.md,
 * "Sync API"). A check carries its own UUID, made on the device: the idempotency key.
 */
import { overallVelocity } from './severity.ts';
import { z } from 'zod';
import { queryToObject } from './form.ts';
import { DIRECTIONS_LIST, MODE_ORIGINS_LIST } from './shared-enums.ts';
import { FREQUENCY_UNITS, toHz } from '../frequency.ts';

export const MAX_PUSH_ITEMS = 50;
export const MAX_PUSH_BYTES = 1024 * 1024;

const uuid = z.uuid({ error: 'must be a UUID' });
const finiteNumber = (what: string) =>
	z.number({ error: `${what} must be a number` }).finite(`${what} must be finite`);

/** A number typed on the tablet ("1 185", "17,2"); anything else is NaN and fails the schema. */
const typedNumber = (s: string) => {
	const t = s.trim().replace(/\s/g, '').replace(',', '.');
	return /^[-+]?(\d+\.?\d*|\.\d+)(e[-+]?\d+)?$/i.test(t) ? Number(t) : Number.NaN;
};

export const modeInput = z
	.object({
		frequencyHz: finiteNumber('Natural frequency')
			.positive('Natural frequency must be greater than zero (Hz).')
			.max(100_000, 'Natural frequency must be at most 100 kHz.'),
		dampingRatio: finiteNumber('Damping ratio')
			.positive('Damping ratio must be greater than zero (for example 0.02), or leave it empty.')
			.max(1, 'Damping ratio must be at most 1.')
			.nullable(),
		direction: z.enum(DIRECTIONS_LIST).nullable(),
		location: z.string().trim().max(200, 'location is at most 200 characters').nullable(),
		origin: z.enum(MODE_ORIGINS_LIST),
		recordingId: uuid.nullable().optional()
	})
	.strict();

export type ModeInput = z.infer<typeof modeInput>;

/**
 * Floor check's "type a natural frequency" form, read into a mode with the same limits. The
 * frequency is typed in the user's unit (Hz or CPM) and kept in Hz.
 */
export const modeText = z
	.object({
		freq: z.string(),
		zeta: z.string(),
		direction: z.string(),
		location: z.string(),
		unit: z.enum(FREQUENCY_UNITS).default('Hz')
	})
	.transform((f, ctx) => {
		const typed = typedNumber(f.freq);
		if (!Number.isFinite(typed)) {
			ctx.addIssue({
				code: 'custom',
				message: `Natural frequency: enter a number of ${f.unit === 'CPM' ? 'cycles per minute' : 'hertz'} greater than zero.`
			});
			return z.NEVER;
		}
		const frequencyHz = toHz(typed, f.unit);
		const dampingRatio = f.zeta.trim() === '' ? null : typedNumber(f.zeta);
		if (dampingRatio !== null && !Number.isFinite(dampingRatio)) {
			ctx.addIssue({
				code: 'custom',
				message:
					'Damping ratio: enter a number between 0 and 1 (for example 0.02), or leave it empty.'
			});
			return z.NEVER;
		}
		return {
			frequencyHz,
			dampingRatio,
			direction: f.direction === '' ? null : f.direction,
			location: f.location.trim() || null,
			origin: 'typed' as ModeInput['origin']
		};
	})
	.pipe(modeInput);

/** 2000-01-01: no check is older; a tablet whose clock is off by more than a day is refused */
const EARLIEST_CHECK = Date.UTC(2000, 0, 1);
const CLOCK_SKEW_MS = 86_400_000;

export const VERDICT_LIST = ['clear', 'tight', 'conflict', 'unchecked'] as const;

/** The measured running speed: the same limits on the tablet's field and in a pushed check. */
export const measuredRpm = finiteNumber('Running speed')
	.positive('Running speed must be greater than zero (rpm).')
	.max(100_000, 'Running speed must be at most 100 000 rpm.');
export const driveSetpointHz = finiteNumber('Drive setpoint')
	.positive('Drive setpoint must be greater than zero (Hz), or leave it empty.')
	.max(1000, 'Drive setpoint must be at most 1000 Hz.');

/** Floor check's speed field (rpm). */
export const speedText = z
	.string()
	.transform(typedNumber)
	.pipe(
		z
			.number({ error: 'Running speed: enter the measured rpm as a number.' })
			.refine(Number.isFinite, 'Running speed: enter the measured rpm as a number.')
			.pipe(measuredRpm)
	);

/** Floor check's drive setpoint field (Hz): empty means none. */
export const setpointText = z
	.string()
	.transform((s) => (s.trim() === '' ? null : typedNumber(s)))
	.pipe(
		z
			.number({ error: 'Drive setpoint: a number of hertz, or leave it empty.' })
			.refine(Number.isFinite, 'Drive setpoint: a number of hertz, or leave it empty.')
			.pipe(driveSetpointHz)
			.nullable()
	);

/** Floor check's overall vibration field (mm/s r.m.s.): empty means not measured. */
export const velocityText = z
	.string()
	.transform((s) => (s.trim() === '' ? null : typedNumber(s)))
	.pipe(
		z
			.number({ error: 'Overall velocity: a number of mm/s, or leave it empty.' })
			.refine(Number.isFinite, 'Overall velocity: a number of mm/s, or leave it empty.')
			.pipe(overallVelocity)
			.nullable()
	);

/** The first problem of a failed parse, as one sentence for the screen. */
/**
 * The first problem as a person reads it beside a form: the message alone (each names its field
 * in words), without the internal field path that firstProblem puts first for API answers.
 */
export function formProblem(error: z.ZodError): string {
	return error.issues[0].message;
}

export function firstProblem(error: z.ZodError): string {
	const issue = error.issues[0];
	const path = issue.path.join('.');
	return path ? `${path}: ${issue.message}` : issue.message;
}

export const checkPush = z
	.object({
		id: uuid,
		/** the user who recorded it on the tablet; the server refuses it under anyone else's session */
		authorId: z.string().min(1).max(64).optional(),
		assetId: z.string().min(1).max(64),
		checkedAt: z
			.number({ error: 'checkedAt must be a time in milliseconds' })
			.int('checkedAt must be whole milliseconds')
			.min(EARLIEST_CHECK, 'checkedAt is before the year 2000')
			.refine(
				(t) => t <= Date.now() + CLOCK_SKEW_MS,
				'checkedAt is more than a day in the future: check the tablet’s clock'
			),
		measuredRpm,
		driveSetpointHz: driveSetpointHz.nullable(),
		/** overall vibration velocity, mm/s r.m.s., on a bearing housing; absent or null: not measured */
		overallVelocityMmS: overallVelocity.nullable().optional(),
		notes: z.string().max(4000, 'notes are at most 4000 characters'),
		replacesCheckId: uuid.nullable(),
		modes: z
			.array(modeInput)
			.min(1, 'a check needs at least one natural frequency')
			.max(50, 'at most 50 natural frequencies per check'),
		/** bump-test files uploaded before this check (POST /api/recordings), with the peaks the device found */
		recordings: z
			.array(
				z
					.object({
						id: uuid,
						deviceFrequenciesHz: z.array(z.number().finite().positive()).max(50)
					})
					.strict()
			)
			.max(5, 'at most 5 recordings per check')
			.optional(),
		/** what the device computed and showed; the server recomputes and keeps its own */
		device: z
			.object({
				verdict: z.enum(VERDICT_LIST),
				verdictAtSpeed: z.enum(VERDICT_LIST),
				worstMarginAtSpeedPct: z.number().finite().nullable(),
				worstMarginOverRangePct: z.number().finite().nullable(),
				severityZone: z.enum(['A', 'B', 'C', 'D']).nullable().optional()
			})
			.strict()
	})
	.strict();

export type CheckPush = z.infer<typeof checkPush>;

/** The batch is checked loosely at the door, each item strictly, so one bad item cannot sink the others. */
export const pushBatch = z
	.object({
		clientId: z.string().min(1).max(64),
		items: z
			.array(z.unknown())
			.min(1, 'a push needs at least one item')
			.max(MAX_PUSH_ITEMS, `a push carries at most ${MAX_PUSH_ITEMS} items`)
	})
	.strict();

/** The pull's address: the cursor of the last pull (0 for the first) and its scope key. */
export const pullQuery = z
	.object({
		since: z
			.string()
			.regex(/^\d{1,15}$/, 'since must be a whole number (the cursor of the last pull, or 0).')
			.transform(Number)
			.default(0),
		scope: z
			.string()
			.regex(/^[0-9a-f]{16}$/, 'scope must be the key of the last pull.')
			.nullable()
			.default(null)
	})
	.strict();

/** The pull's query parsed; an empty parameter counts as absent. */
export const parsePullQuery = (params: URLSearchParams) =>
	pullQuery.safeParse(queryToObject(params));

export type ItemStatus = 'applied' | 'duplicate' | 'rejected';

export interface ItemResult {
	id: string | null;
	status: ItemStatus;
	reason?: string;
	verdict?: string;
}

export interface PushResponse {
	results: ItemResult[];
	/** set when the server stopped part-way: items after the last result were not processed */
	error?: string;
}

export interface PulledSource {
	id: string;
	kind: string;
	label: string;
	params: Record<string, unknown>;
	sortOrder: number;
}

export interface PulledAsset {
	id: string;
	tag: string;
	name: string;
	siteId: string;
	siteName: string;
	areaName: string | null;
	machineKind: string;
	driveType: string;
	minRpm: number;
	maxRpm: number;
	nominalRpm: number | null;
	motorPoles: number | null;
	/** motor slip at rated load, % (null: unknown) */
	slipPct: number | null;
	driveRatio: number;
	skipBands: number;
	ruleSetId: string | null;
	/** the vibration severity machine group; null: no zone */
	machineGroup: 'group1' | 'group2' | null;
	sources: PulledSource[];
	version: number;
	/** the asset's latest check on the server, for a retest on the floor */
	lastCheck: {
		id: string;
		checkedAt: number;
		checkedBy: string | null;
		measuredRpm: number | null;
		verdict: (typeof VERDICT_LIST)[number];
		modes: {
			frequencyHz: number;
			dampingRatio: number | null;
			direction: string | null;
			location: string | null;
		}[];
	} | null;
	/** follow-ups not yet closed by a clear retest */
	openFollowUps: { id: string; title: string; status: string; dueDate: string | null }[];
}

export interface PulledSeverityLimit {
	machineGroup: 'group1' | 'group2';
	support: 'rigid' | 'flexible';
	abMmS: number;
	bcMmS: number;
	cdMmS: number;
	source: string;
}

export interface PulledRuleSet {
	id: string;
	name: string;
	kind: 'fixed' | 'amplification';
	percent: number | null;
	perKind: Record<string, number> | null;
	source: string;
	edition: string;
	version: number;
}

export interface PullResponse {
	cursor: number;
	/** true when the client must replace what it holds (first pull, scope changed, unknown cursor) */
	full: boolean;
	/** the user's scope key: send it back with the cursor */
	scope: string;
	assets: PulledAsset[];
	ruleSets: PulledRuleSet[];
	/** every severity limit row (a handful): the tablet zones a typed level with them */
	severityLimits: PulledSeverityLimit[];
	/** assets that left the user's scope since the cursor */
	deleted: { entity: 'asset'; id: string }[];
	serverTime: number;
}
