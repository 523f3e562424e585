/**
 * Avoidance bands for a variable-frequency drive, and remedies that move a mode clear.
 *
 * A pair (mode f_n, order k) is inside its required margin when its excitation f_e = k·N/60 lies in
 * (f_n/(1 + R_above), f_n/(1 − R_below)) — the margin is relative to f_e, and the rule may ask a
 * different margin on each side. That is the shaft speed band 60·f_e/k; bands are merged, clipped
 * to the speed range and mapped to motor rpm (drive ratio) and drive output Hz ≈ motor rpm·p/120
 * (synchronous speed, slip not included). Drives take 2–4 skip bands, 3 being most common
 * (../shared/domain.md §6.3): more bands than that draws a warning and the ways out.
 */
import {
	atLeast,
	evenPoles,
	slipFraction,
	integerAtLeast,
	object,
	positive,
	nonNegative,
	VibrationInputError
} from './errors.ts';
import { excitationCatalogue, lineBandHz, type ExcitationLine } from './excitation.ts';
import {
	MIN_MEASURED_RPM,
	requiredMarginPct,
	validateSpeedRange,
	pairVerdict,
	type CheckInput,
	type MarginRule,
	type Verdict
} from './margins.ts';

export interface DriveSettings {
	/** motor rpm per reference-shaft rpm (belt or gearbox ratio); 1 for direct drive */
	motorRpmPerShaftRpm?: number;
	/** motor poles, for drive output Hz (an even number) */
	poles?: number | null;
	/** the induction motor's slip as a fraction (0.011 for 1.1 %); null or absent: synchronous */
	slip?: number | null;
	/** skip bands the drive offers (default 3) */
	skipBands?: number;
}

export interface BandCause {
	modeIndex: number;
	naturalHz: number;
	lineId: string;
	label: string;
}

export interface AvoidanceBand {
	lowRpm: number;
	highRpm: number;
	motorLowRpm: number;
	motorHighRpm: number;
	/** drive output Hz at the band edges (motor rpm × p / (120 (1 − s)); synchronous without a slip); null without motor poles */
	driveLowHz: number | null;
	driveHighHz: number | null;
	causes: BandCause[];
}

export interface AvoidancePlan {
	bands: AvoidanceBand[];
	skipBands: number;
	tooMany: boolean;
	/** pairs with a fixed-frequency line inside their margin: no speed change helps */
	unavoidable: BandCause[];
	/** true when no speed in the range is clear of every band */
	noClearSpeed: boolean;
	warnings: string[];
	/** the three ways drives take bands (domain.md §6.3), in drive Hz when poles are known, else shaft rpm */
	exports: {
		unit: 'Hz' | 'rpm';
		centreWidth: { centre: number; width: number }[];
		startWidth: { start: number; width: number }[];
		lowHigh: { low: number; high: number }[];
	};
	/** speed-limit changes that would clear every band, when one exists */
	speedLimits: { raiseMinRpmTo: number | null; lowerMaxRpmTo: number | null };
	slipNote: string;
}

interface RawBand {
	lo: number;
	hi: number;
	causes: BandCause[];
}

/** Required margins below and above for a mode under a rule, as fractions. */
function sideMargins(
	rule: MarginRule,
	af: number | null,
	kind: ExcitationLine['kind']
): { below: number; above: number } {
	return {
		below:
			requiredMarginPct(rule, {
				amplificationFactor: af,
				position: 'below',
				excitationKind: kind
			}) / 100,
		above:
			requiredMarginPct(rule, {
				amplificationFactor: af,
				position: 'above',
				excitationKind: kind
			}) / 100
	};
}

/** The open excitation interval (Hz) inside which a pair is short of its required margin. */
export function excitationWindowHz(
	naturalHz: number,
	below: number,
	above: number
): [number, number] {
	const fn = positive('naturalHz', naturalHz);
	const rb = nonNegative('required margin below', below);
	const ra = nonNegative('required margin above', above);
	return [fn / (1 + ra), rb >= 1 ? Infinity : fn / (1 - rb)];
}

function modeList(input: CheckInput): { fn: number; af: number | null }[] {
	if (!Array.isArray(input.modes)) throw new VibrationInputError('modes', 'a list', input.modes);
	return input.modes.map((m, i) => {
		const z = m.dampingRatio;
		return {
			fn: positive(`modes[${i}].frequencyHz`, m.frequencyHz),
			af: z === null || z === undefined ? null : 1 / (2 * positive(`modes[${i}].dampingRatio`, z))
		};
	});
}

export function mergeBands<T extends { lo: number; hi: number; causes: BandCause[] }>(
	bands: T[]
): RawBand[] {
	const sorted = [...bands].sort((a, b) => a.lo - b.lo);
	const out: RawBand[] = [];
	for (const b of sorted) {
		const last = out[out.length - 1];
		if (last && b.lo <= last.hi) {
			last.hi = Math.max(last.hi, b.hi);
			last.causes.push(...b.causes);
		} else out.push({ lo: b.lo, hi: b.hi, causes: [...b.causes] });
	}
	return out;
}

/**
 * An induction motor's slip from its nameplate: s = 1 − n_rated / n_sync, n_sync = 120·f/p
 * (common practice). 4 poles, 60 Hz, 1,780 rpm → n_sync 1,800 rpm, s = 1.11 %.
 */
export function slipFromNameplate(
	ratedRpm: number,
	poles: number,
	lineFrequencyHz: number
): number {
	const p = evenPoles(poles);
	const f = positive('line frequency', lineFrequencyHz);
	const sync = (120 * f) / p;
	const n = positive('rated speed', ratedRpm);
	if (n >= sync)
		throw new VibrationInputError('rated speed', `below the synchronous ${sync} rpm`, ratedRpm);
	return slipFraction(1 - n / sync);
}

/** Avoidance bands of a check over its speed range. */
export function avoidanceBands(input: CheckInput, drive: DriveSettings = {}): AvoidancePlan {
	object('check', input);
	const range = validateSpeedRange(input.speedRange);
	const ratio = positive('motorRpmPerShaftRpm', drive.motorRpmPerShaftRpm ?? 1);
	const poles = drive.poles === null || drive.poles === undefined ? null : evenPoles(drive.poles);
	const slip = drive.slip === null || drive.slip === undefined ? null : slipFraction(drive.slip);
	// drive output Hz per motor rpm: f = p·n / (120 (1 − s)) (common practice; domain.md §6.3)
	const hzPerMotorRpm = poles === null ? null : poles / (120 * (1 - (slip ?? 0)));
	const slots = integerAtLeast('skipBands', drive.skipBands ?? 3, 0);
	const lines = excitationCatalogue(input.sources);
	const modes = modeList(input);
	const raw: RawBand[] = [];
	const unavoidable: BandCause[] = [];
	for (const line of lines) {
		for (let i = 0; i < modes.length; i++) {
			const { fn, af } = modes[i];
			const req = sideMargins(input.rule, af, line.kind);
			const [wLo, wHi] = excitationWindowHz(fn, req.below, req.above);
			const cause = { modeIndex: i, naturalHz: fn, lineId: line.id, label: line.label };
			if (line.order === null) {
				const f = line.fixedHz as number;
				if (f > wLo && f < wHi) unavoidable.push(cause);
				continue;
			}
			const wl = (60 * wLo) / line.order;
			const wh = (60 * wHi) / line.order;
			const lo = Math.max(range.minRpm, wl);
			const hi = Math.min(range.maxRpm, wh);
			// a fixed-speed machine (min = max) inside the window gets a zero-width band
			if (lo < hi || (lo === hi && wl < lo && lo < wh)) {
				raw.push({ lo, hi, causes: [cause] });
			}
		}
	}
	const merged = mergeBands(raw);
	const bands: AvoidanceBand[] = merged.map((b) => ({
		lowRpm: b.lo,
		highRpm: b.hi,
		motorLowRpm: b.lo * ratio,
		motorHighRpm: b.hi * ratio,
		driveLowHz: hzPerMotorRpm === null ? null : b.lo * ratio * hzPerMotorRpm,
		driveHighHz: hzPerMotorRpm === null ? null : b.hi * ratio * hzPerMotorRpm,
		causes: b.causes
	}));
	const noClearSpeed =
		merged.length === 1 && merged[0].lo <= range.minRpm && merged[0].hi >= range.maxRpm;
	const first = merged[0];
	const last = merged[merged.length - 1];
	const speedLimits = {
		raiseMinRpmTo: last && last.hi < range.maxRpm ? last.hi : null,
		lowerMaxRpmTo: first && first.lo > range.minRpm ? first.lo : null
	};
	const warnings: string[] = [];
	const tooMany = bands.length > slots;
	if (tooMany) {
		warnings.push(
			`${bands.length} avoidance bands but the drive takes ${slots}: merge neighbouring bands, ` +
				`${speedLimits.raiseMinRpmTo !== null ? `raise the minimum speed to ${Math.ceil(speedLimits.raiseMinRpmTo)} rpm, ` : ''}` +
				`or detune the structure (stiffen, add or remove mass, add damping).`
		);
	}
	if (noClearSpeed)
		warnings.push(
			'No speed in the range is clear: skipping cannot help; detune the structure or change the speed range.'
		);
	if (unavoidable.length > 0)
		warnings.push(
			`${unavoidable.length} pair(s) with a fixed-frequency excitation are inside their margin at every speed: only detuning helps.`
		);
	const inHz = poles !== null;
	const lowHigh = bands.map((b) =>
		inHz
			? { low: b.driveLowHz as number, high: b.driveHighHz as number }
			: { low: b.lowRpm, high: b.highRpm }
	);
	return {
		bands,
		skipBands: slots,
		tooMany,
		unavoidable,
		noClearSpeed,
		warnings,
		exports: {
			unit: inHz ? 'Hz' : 'rpm',
			centreWidth: lowHigh.map((b) => ({ centre: (b.low + b.high) / 2, width: b.high - b.low })),
			startWidth: lowHigh.map((b) => ({ start: b.low, width: b.high - b.low })),
			lowHigh
		},
		speedLimits,
		slipNote:
			slip === null
				? 'Drive Hz are synchronous (motor rpm × poles / 120): give the motor’s slip (or its nameplate speed) for the Hz an induction motor needs, 1–3 % higher.'
				: `Drive Hz include the motor’s slip of ${+(slip * 100).toFixed(2)} % (motor rpm × poles / (120 × (1 − slip))).`
	};
}

export interface FrequencyTarget {
	frequencyHz: number;
	/** stiffness change that moves the mode there, % (f ∝ √k) */
	stiffnessChangePct: number;
	/** mass change that moves the mode there, % (f ∝ 1/√m) */
	massChangePct: number;
	/** the stiffness change is beyond a field change (more than ±50 %): a redesign */
	stiffnessIsRedesign: boolean;
	massIsRedesign: boolean;
}

/**
 * Beyond this change of stiffness or mass, % either way, a remedy is a redesign rather than a
 * field fix (a brace, a gusset, added mass): common practice.
 */
export const FIELD_CHANGE_LIMIT_PCT = 50;

export interface ModeRemedy {
	modeIndex: number;
	naturalHz: number;
	clear: boolean;
	raiseTo: FrequencyTarget | null;
	lowerTo: FrequencyTarget | null;
}

/** Stiffness and mass changes that move f_n to `targetHz`: k'/k = (f'/f)², m'/m = (f/f')². */
export function retuneTo(naturalHz: number, targetHz: number): FrequencyTarget {
	const f = positive('naturalHz', naturalHz);
	const t = positive('targetHz', targetHz);
	const stiffnessChangePct = ((t / f) ** 2 - 1) * 100;
	const massChangePct = ((f / t) ** 2 - 1) * 100;
	return {
		frequencyHz: t,
		stiffnessChangePct,
		massChangePct,
		stiffnessIsRedesign: Math.abs(stiffnessChangePct) > FIELD_CHANGE_LIMIT_PCT,
		massIsRedesign: Math.abs(massChangePct) > FIELD_CHANGE_LIMIT_PCT
	};
}

/**
 * For each mode, the nearest frequencies above and below that clear every excitation over the
 * speed range, and the stiffness or mass change to get there. Forbidden zone of one line sweeping
 * [a, b]: (a·(1 − R_below), b·(1 + R_above)). `targetPct` replaces the rule's margin if given.
 */
export function modeRemedies(
	input: CheckInput,
	options: { targetPct?: number } = {}
): ModeRemedy[] {
	object('check', input);
	const range = validateSpeedRange(input.speedRange);
	const lines = excitationCatalogue(input.sources);
	const modes = modeList(input);
	const target =
		options.targetPct === undefined ? null : nonNegative('targetPct', options.targetPct) / 100;
	return modes.map(({ fn, af }, modeIndex) => {
		const zones: RawBand[] = lines.map((line) => {
			const [a, b] = lineBandHz(line, range.minRpm, range.maxRpm);
			const req =
				target === null ? sideMargins(input.rule, af, line.kind) : { below: target, above: target };
			return { lo: Math.max(0, a * (1 - req.below)), hi: b * (1 + req.above), causes: [] };
		});
		const merged = mergeBands(zones);
		const hit = merged.find((z) => fn > z.lo && fn < z.hi);
		if (!hit) return { modeIndex, naturalHz: fn, clear: true, raiseTo: null, lowerTo: null };
		const up = hit.hi * (1 + 1e-9);
		const down = hit.lo * (1 - 1e-9);
		return {
			modeIndex,
			naturalHz: fn,
			clear: false,
			raiseTo: Number.isFinite(up) ? retuneTo(fn, up) : null,
			// a zone reaching down to (almost) 0 Hz leaves no way down: more than a million-fold mass is no remedy
			lowerTo: down > fn * 1e-3 ? retuneTo(fn, down) : null
		};
	});
}

/** Verdict of one pair at one shaft speed, for tests and the diagram's hover readout. */
export function pairVerdictAtRpm(
	naturalHz: number,
	line: ExcitationLine,
	rpm: number,
	rule: MarginRule,
	af: number | null
): Verdict {
	const fe =
		line.order === null
			? (line.fixedHz as number)
			: (line.order * atLeast('rpm', rpm, MIN_MEASURED_RPM, 'rpm')) / 60;
	const position = naturalHz < fe ? 'below' : 'above';
	const req = requiredMarginPct(rule, {
		amplificationFactor: af,
		position,
		excitationKind: line.kind
	});
	return pairVerdict((Math.abs(naturalHz - fe) / fe) * 100, req);
}
