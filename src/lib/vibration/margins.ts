/**
 * Separation margins, required margins and verdicts.
 *
 * Convention (recorded with every result): the margin of a natural frequency f_n to an excitation
 * f_e is |f_n − f_e| / f_e × 100 %, relative to the excitation (../shared/domain.md §1.1, common
 * practice). Over a speed range an order sweeps [k·N_min, k·N_max]; a mode inside that band is
 * crossed and its margin is 0; outside it the margin is taken to the nearest edge.
 */
import { atLeast, finite, nonNegative, object, positive, VibrationInputError } from './errors.ts';
import {
	EXCITATION_KINDS,
	excitationCatalogue,
	lineBandHz,
	lineFrequencyHz,
	type ExcitationKind,
	type ExcitationLine,
	type ExcitationSource
} from './excitation.ts';

export const MARGIN_CONVENTION = 'relative to excitation frequency: |fn − fe| / fe';

/** Slowest measured speed the engine accepts, rpm: below it an excitation frequency is meaningless. */
export const MIN_MEASURED_RPM = 0.001;

/** SM = |f_n − f_e| / f_e × 100 %. */
export function separationMarginPct(naturalHz: number, excitationHz: number): number {
	const fn = positive('naturalHz', naturalHz);
	const fe = positive('excitationHz', excitationHz);
	return (Math.abs(fn - fe) / fe) * 100;
}

export type Position = 'below' | 'above';

/**
 * The margin of f_n to a band [lo, hi] swept by an excitation, with the side the mode sits on.
 * Inside the band (crossed) the margin is 0 and `position` is 'inside'. A band that starts at 0
 * (a speed range from standstill) has no lower edge to measure to: a mode below it is inside.
 */
export function bandMarginPct(
	naturalHz: number,
	loHz: number,
	hiHz: number
): { marginPct: number; position: Position | 'inside' } {
	const fn = positive('naturalHz', naturalHz);
	const lo = nonNegative('band low (Hz)', loHz);
	const hi = finite('band high (Hz)', hiHz);
	if (hi < lo) throw new VibrationInputError('band high (Hz)', `at least the band low ${lo}`, hi);
	if (fn < lo) return { marginPct: ((lo - fn) / lo) * 100, position: 'below' };
	if (fn > hi) {
		if (hi <= 0) return { marginPct: 0, position: 'inside' };
		return { marginPct: ((fn - hi) / hi) * 100, position: 'above' };
	}
	return { marginPct: 0, position: 'inside' };
}

/** A rule set's margin rule. */
export type MarginRule =
	| {
			kind: 'fixed';
			/** required margin for every excitation kind without its own entry, % */
			percent: number;
			perKind?: Partial<Record<ExcitationKind, number>>;
	  }
	| {
			/**
			 * API RP 684 / API 617 style, from the mode's amplification factor, for what that rule is
			 * written for: rotor lateral criticals against the running-speed orders (excitation kind
			 * `shaft`). A mode with no damping measured has no AF: the caps (16 % below, 26 % above)
			 * apply, the conservative reading. Every other kind (vane and blade pass, gear mesh,
			 * bearing tones, belts, line, fixed) keeps a fixed margin: `perKind[kind]`, else
			 * `percent`, else 10 % (the API 610 structural figure, domain.md §1.3).
			 */
			kind: 'amplification';
			percent?: number;
			perKind?: Partial<Record<ExcitationKind, number>>;
	  };

/** The excitation kinds the amplification rule governs; the rest keep a fixed margin. */
export const AMPLIFICATION_KINDS: readonly ExcitationKind[] = ['shaft'];
/** The fixed margin beside the amplification rule when the rule set gives none, % (API 610 structural). */
export const STRUCTURAL_DEFAULT_PCT = 10;

export const DEFAULT_RULE: MarginRule = { kind: 'fixed', percent: 10 };

/** API 684 thresholds (../shared/domain.md §1.2, [S2]). */
export const API_AF_THRESHOLD = 2.5;
export const API_CAP_BELOW = 16;
export const API_CAP_ABOVE = 26;

/**
 * The required separation margin, %.
 * - fixed: `perKind[excitationKind]` when given, else `percent` (default 10 %, common practice).
 * - amplification (API RP 684 style, [S2]): AF < 2.5 → 0 (critically damped, no margin needed);
 *   AF ≥ 2.5 → below: min(16, 17·(1 − 1/(AF − 1.5))); above: min(26, 10 + 17·(1 − 1/(AF − 1.5))).
 *   We read the threshold as "AF ≥ 2.5 needs a margin" (public code differs; domain.md §1.2), so
 *   at exactly 2.5 the above-side answer is 10 %. AF unknown → the caps.
 */
export function requiredMarginPct(
	rule: MarginRule,
	context: {
		amplificationFactor?: number | null;
		position: Position | 'inside';
		excitationKind?: ExcitationKind;
	}
): number {
	object('rule', rule);
	object('context', context);
	const position = context.position;
	if (position !== 'below' && position !== 'above' && position !== 'inside') {
		throw new VibrationInputError('position', 'below, above or inside', position);
	}
	if (rule.kind === 'fixed') {
		const own =
			context.excitationKind !== undefined ? rule.perKind?.[context.excitationKind] : undefined;
		return nonNegative(
			own !== undefined ? `rule percent for ${context.excitationKind}` : 'rule percent',
			own ?? rule.percent
		);
	}
	if (rule.kind !== 'amplification')
		throw new VibrationInputError(
			'rule kind',
			'fixed or amplification',
			(rule as { kind: unknown }).kind
		);
	if (context.excitationKind !== undefined && !AMPLIFICATION_KINDS.includes(context.excitationKind))
		return nonNegative(
			`rule percent for ${context.excitationKind}`,
			rule.perKind?.[context.excitationKind] ?? rule.percent ?? STRUCTURAL_DEFAULT_PCT
		);
	const af = context.amplificationFactor;
	return amplificationRequired(
		af === null || af === undefined ? null : positive('amplificationFactor', af),
		position
	);
}

/** The amplification rule for a validated AF (null = unknown). A crossed mode takes the stricter, above-side figure. */
function amplificationRequired(af: number | null, position: Position | 'inside'): number {
	const above = position !== 'below';
	if (af === null) return above ? API_CAP_ABOVE : API_CAP_BELOW;
	if (af < API_AF_THRESHOLD) return 0;
	const base = 17 * (1 - 1 / (af - 1.5));
	return above ? Math.min(API_CAP_ABOVE, 10 + base) : Math.min(API_CAP_BELOW, base);
}

/** A rule checked once, then applied many times without re-validation (the hot loop of a fleet). */
export function compileRule(
	rule: MarginRule
): (af: number | null, position: Position | 'inside', kind: ExcitationKind) => number {
	object('rule', rule);
	if (rule.kind === 'fixed') {
		const base = nonNegative('rule percent', rule.percent);
		const per: Partial<Record<ExcitationKind, number>> = {};
		for (const [k, v] of Object.entries(rule.perKind ?? {}))
			per[k as ExcitationKind] = nonNegative(`rule percent for ${k}`, v);
		return (_af, _position, kind) => per[kind] ?? base;
	}
	if (rule.kind !== 'amplification')
		throw new VibrationInputError(
			'rule kind',
			'fixed or amplification',
			(rule as { kind: unknown }).kind
		);
	const other = nonNegative('rule percent', rule.percent ?? STRUCTURAL_DEFAULT_PCT);
	const per: Partial<Record<ExcitationKind, number>> = {};
	for (const [k, v] of Object.entries(rule.perKind ?? {}))
		per[k as ExcitationKind] = nonNegative(`rule percent for ${k}`, v);
	return (af, position, kind) =>
		AMPLIFICATION_KINDS.includes(kind) ? amplificationRequired(af, position) : (per[kind] ?? other);
}

const verdictOf = (sm: number, r: number): Verdict =>
	sm >= r ? 'clear' : sm >= r / 2 ? 'tight' : 'conflict';

export type Verdict = 'clear' | 'tight' | 'conflict';
export type AssetVerdict = Verdict | 'unchecked';

export const VERDICT_RANK: Record<AssetVerdict, number> = {
	unchecked: 0,
	clear: 1,
	tight: 2,
	conflict: 3
};

/** clear when SM ≥ R, tight when R/2 ≤ SM < R, conflict when SM < R/2 (product design). */
export function pairVerdict(marginPct: number, requiredPct: number): Verdict {
	const sm = nonNegative('marginPct', marginPct);
	const r = nonNegative('requiredPct', requiredPct);
	if (sm >= r) return 'clear';
	return sm >= r / 2 ? 'tight' : 'conflict';
}

/** The worse of two verdicts. */
export function worseVerdict<A extends AssetVerdict>(a: A, b: A): A {
	return VERDICT_RANK[b] > VERDICT_RANK[a] ? b : a;
}

/** ISO 10816-3 / 20816-3: rigid when the lowest natural frequency ≥ 1.25 × the main excitation ([S2]). */
export function supportClass(
	lowestNaturalHz: number,
	mainExcitationHz: number
): 'rigid' | 'flexible' {
	const fn = positive('lowestNaturalHz', lowestNaturalHz);
	const fe = positive('mainExcitationHz', mainExcitationHz);
	return fn >= 1.25 * fe ? 'rigid' : 'flexible';
}

export interface Mode {
	frequencyHz: number;
	/** damping ratio ζ if measured; gives the amplification factor 1/(2ζ) */
	dampingRatio?: number | null;
	direction?: 'horizontal' | 'vertical' | 'axial' | null;
	location?: string | null;
}

export interface SpeedRange {
	minRpm: number;
	maxRpm: number;
}

export interface PairResult {
	modeIndex: number;
	naturalHz: number;
	lineId: string;
	sourceId: string;
	kind: ExcitationKind;
	label: string;
	/** the line's frequency at the measured speed, Hz (null when no speed was measured) */
	excitationHz: number | null;
	marginAtSpeedPct: number | null;
	requiredAtSpeedPct: number | null;
	verdictAtSpeed: Verdict | null;
	/** the band the line sweeps over the operating envelope, Hz */
	bandHz: [number, number];
	marginOverRangePct: number;
	requiredOverRangePct: number;
	verdictOverRange: Verdict;
	positionOverRange: Position | 'inside';
	/**
	 * What a bare verdict would hide: a line that sweeps across the mode while the rule asks no
	 * margin of it (the amplification rule below AF 2.5) reads "clear", with this remark.
	 */
	remark: string | null;
}

export const CROSSED_NO_MARGIN_REMARK =
	'The excitation sweeps across this mode; the rule asks no margin (amplification factor below 2.5, critically damped by API 684). Confirm the damping with a second measurement before relying on it.';

export interface CheckInput {
	speedRange: SpeedRange;
	/**
	 * The asset's excitation lines when already built ({@link excitationCatalogue} of `sources`):
	 * a fleet job builds each asset's catalogue once and evaluates its checks against it.
	 */
	lines?: readonly ExcitationLine[];
	/** measured running speed, rpm; null for a desk review with no measurement */
	measuredRpm: number | null;
	sources: readonly ExcitationSource[];
	modes: readonly Mode[];
	rule: MarginRule;
}

export interface CheckResult {
	convention: string;
	/** the speeds evaluated: the speed range, widened to include the measured speed */
	envelope: SpeedRange;
	measuredOutsideRange: boolean;
	lines: ExcitationLine[];
	pairs: PairResult[];
	/** worst verdict over the envelope; 'unchecked' when there are no modes */
	verdict: AssetVerdict;
	verdictAtSpeed: AssetVerdict;
	worstAtSpeed: PairResult | null;
	worstOverRange: PairResult | null;
}

export function validateSpeedRange(range: SpeedRange): SpeedRange {
	object('speedRange', range);
	const lo = nonNegative('minRpm', range.minRpm);
	const hi = positive('maxRpm', range.maxRpm);
	if (hi < lo) throw new VibrationInputError('maxRpm', `at least minRpm ${lo}`, hi);
	return { minRpm: lo, maxRpm: hi };
}

const ALLOWED_KINDS: readonly string[] = EXCITATION_KINDS;

/** Orders pairs worst first: verdict, then how far short of its requirement, then margin. */
export function comparePairs(
	a: PairResult,
	b: PairResult,
	at: 'speed' | 'range' = 'range'
): number {
	const va = at === 'speed' ? a.verdictAtSpeed : a.verdictOverRange;
	const vb = at === 'speed' ? b.verdictAtSpeed : b.verdictOverRange;
	const rank = VERDICT_RANK[vb ?? 'unchecked'] - VERDICT_RANK[va ?? 'unchecked'];
	if (rank !== 0) return rank;
	const sa =
		at === 'speed'
			? (a.marginAtSpeedPct ?? Infinity) - (a.requiredAtSpeedPct ?? 0)
			: a.marginOverRangePct - a.requiredOverRangePct;
	const sb =
		at === 'speed'
			? (b.marginAtSpeedPct ?? Infinity) - (b.requiredAtSpeedPct ?? 0)
			: b.marginOverRangePct - b.requiredOverRangePct;
	return sa - sb;
}

export interface EvaluateOptions {
	/**
	 * false: verdicts and the worst pairs only, without the full pair table — the fleet path
	 * (board recompute, rule-set change); the table is built for the asset on screen.
	 */
	pairs?: boolean;
}

type RequiredFn = (
	af: number | null,
	position: Position | 'inside',
	kind: ExcitationKind
) => number;

/** One pair, from validated inputs. */
function pairOf(
	line: ExcitationLine,
	band: [number, number],
	fe: number | null,
	fn: number,
	af: number | null,
	modeIndex: number,
	required: RequiredFn
): PairResult {
	const [lo, hi] = band;
	let smRange = 0;
	let position: Position | 'inside' = 'inside';
	if (fn < lo) {
		smRange = ((lo - fn) / lo) * 100;
		position = 'below';
	} else if (fn > hi && hi > 0) {
		smRange = ((fn - hi) / hi) * 100;
		position = 'above';
	}
	const reqRange = required(af, position, line.kind);
	let smAt: number | null = null;
	let reqAt: number | null = null;
	let vAt: Verdict | null = null;
	if (fe !== null && fe > 0) {
		smAt = (Math.abs(fn - fe) / fe) * 100;
		reqAt = required(af, fn < fe ? 'below' : 'above', line.kind);
		vAt = verdictOf(smAt, reqAt);
	}
	return {
		modeIndex,
		naturalHz: fn,
		lineId: line.id,
		sourceId: line.sourceId,
		kind: line.kind,
		label: line.label,
		excitationHz: fe,
		marginAtSpeedPct: smAt,
		requiredAtSpeedPct: reqAt,
		verdictAtSpeed: vAt,
		bandHz: band,
		marginOverRangePct: smRange,
		requiredOverRangePct: reqRange,
		verdictOverRange: verdictOf(smRange, reqRange),
		positionOverRange: position,
		remark: position === 'inside' && reqRange === 0 ? CROSSED_NO_MARGIN_REMARK : null
	};
}

/** Verdict rank as a number (1 clear, 2 tight, 3 conflict), for the hot loop. */
const rankOf = (sm: number, r: number): number => (sm >= r ? 1 : sm >= r / 2 ? 2 : 3);
const RANKED: Verdict[] = ['clear', 'clear', 'tight', 'conflict'];

/** Lines handed in precomputed: the shape is checked, since they may come from storage. */
function validLines(lines: readonly ExcitationLine[]): ExcitationLine[] {
	if (!Array.isArray(lines)) throw new VibrationInputError('lines', 'a list', lines);
	for (let i = 0; i < lines.length; i++) {
		const l = lines[i];
		const ok =
			l &&
			typeof l.id === 'string' &&
			((typeof l.order === 'number' && l.order > 0 && l.order < Infinity && l.fixedHz === null) ||
				(l.order === null &&
					typeof l.fixedHz === 'number' &&
					l.fixedHz > 0 &&
					l.fixedHz < Infinity));
		if (!ok)
			throw new VibrationInputError(
				`lines[${i}]`,
				'an excitation line with either a positive order or a positive fixed frequency',
				l
			);
	}
	return lines as ExcitationLine[];
}

/**
 * Every mode × excitation pair of a check, at the measured speed and over the operating envelope,
 * with required margins from the rule and the verdicts.
 */
/** The modes' natural frequencies and amplification factors (1/(2ζ), null without ζ), checked. */
function validModes(modes: readonly Mode[]): { fns: Float64Array; afs: (number | null)[] } {
	if (!Array.isArray(modes)) throw new VibrationInputError('modes', 'a list', modes);
	const n = modes.length;
	const fns = new Float64Array(n);
	const afs: (number | null)[] = new Array(n);
	for (let i = 0; i < n; i++) {
		const m = modes[i];
		object(`modes[${i}]`, m);
		fns[i] = positive(`modes[${i}].frequencyHz`, m.frequencyHz);
		const z = m.dampingRatio;
		afs[i] =
			z === null || z === undefined ? null : 1 / (2 * positive(`modes[${i}].dampingRatio`, z));
	}
	return { fns, afs };
}

/** One pair's margins and requirements, written into `out` (the fleet path builds no object per pair). */
interface Figures {
	sm: number;
	r: number;
	smAt: number | null;
	rAt: number | null;
}

function figuresInto(
	out: Figures,
	kind: ExcitationKind,
	band: [number, number],
	fe: number | null,
	fn: number,
	af: number | null,
	required: RequiredFn
): void {
	// indexed, not destructured: this runs a million times per fleet recompute
	const lo = band[0];
	const hi = band[1];
	let position: Position | 'inside' = 'inside';
	out.sm = 0;
	if (fn < lo) {
		out.sm = ((lo - fn) / lo) * 100;
		position = 'below';
	} else if (fn > hi && hi > 0) {
		out.sm = ((fn - hi) / hi) * 100;
		position = 'above';
	}
	out.r = required(af, position, kind);
	out.smAt = null;
	out.rAt = null;
	if (fe !== null && fe > 0) {
		out.smAt = (Math.abs(fn - fe) / fe) * 100;
		out.rAt = required(af, fn < fe ? 'below' : 'above', kind);
	}
}

/**
 * The worst pair seen, by position, built once at the end: verdict rank first, then how far the
 * margin falls short of its requirement (as comparePairs). Ranks: 1 clear, 2 tight, 3 conflict.
 */
class Worst {
	rank = 0;
	gap = Infinity;
	line = -1;
	mode = -1;
	offer(rank: number, gap: number, line: number, mode: number): void {
		if (rank > this.rank || (rank === this.rank && gap < this.gap)) {
			this.rank = rank;
			this.gap = gap;
			this.line = line;
			this.mode = mode;
		}
	}
}

export function evaluateCheck(input: CheckInput, options: EvaluateOptions = {}): CheckResult {
	object('check', input);
	const range = validateSpeedRange(input.speedRange);
	const measured =
		input.measuredRpm === null || input.measuredRpm === undefined
			? null
			: atLeast('measuredRpm', input.measuredRpm, MIN_MEASURED_RPM, 'rpm');
	const { fns, afs } = validModes(input.modes);
	const lines = input.lines ? validLines(input.lines) : excitationCatalogue(input.sources);
	const envelope =
		measured === null
			? range
			: { minRpm: Math.min(range.minRpm, measured), maxRpm: Math.max(range.maxRpm, measured) };
	const n = fns.length;
	const required = compileRule(input.rule);
	const detail = options.pairs !== false;
	const pairs: PairResult[] = [];
	// ranks: 0 unchecked, 1 clear, 2 tight, 3 conflict
	let rank = n === 0 ? 0 : 1;
	let rankAtSpeed = n === 0 || measured === null ? 0 : 1;
	const worst = new Worst();
	const worstAt = new Worst();
	const f: Figures = { sm: 0, r: 0, smAt: null, rAt: null };
	const bands: [number, number][] = new Array(lines.length);
	const fes: (number | null)[] = new Array(lines.length);
	for (let l = 0; l < lines.length; l++) {
		const line = lines[l];
		if (!ALLOWED_KINDS.includes(line.kind))
			throw new VibrationInputError('excitation kind', EXCITATION_KINDS.join(', '), line.kind);
		const band = (bands[l] = lineBandHz(line, envelope.minRpm, envelope.maxRpm));
		const fe = (fes[l] = measured === null ? null : lineFrequencyHz(line, measured));
		for (let i = 0; i < n; i++) {
			if (detail) {
				// the table kept: the figures from the pair itself
				const p = pairOf(line, band, fe, fns[i], afs[i], i, required);
				pairs.push(p);
				f.sm = p.marginOverRangePct;
				f.r = p.requiredOverRangePct;
				f.smAt = p.marginAtSpeedPct;
				f.rAt = p.requiredAtSpeedPct;
			} else figuresInto(f, line.kind, band, fe, fns[i], afs[i], required);
			const k = rankOf(f.sm, f.r);
			if (k > rank) rank = k;
			worst.offer(k, f.sm - f.r, l, i);
			if (f.smAt !== null && f.rAt !== null) {
				const kAt = rankOf(f.smAt, f.rAt);
				if (kAt > rankAtSpeed) rankAtSpeed = kAt;
				worstAt.offer(kAt, f.smAt - f.rAt, l, i);
			}
		}
	}
	const build = ({ line: l, mode: i }: Worst) =>
		l < 0 ? null : pairOf(lines[l], bands[l], fes[l], fns[i], afs[i], i, required);
	return {
		convention: MARGIN_CONVENTION,
		envelope,
		measuredOutsideRange: measured !== null && (measured < range.minRpm || measured > range.maxRpm),
		lines,
		pairs,
		verdict: rank === 0 ? 'unchecked' : RANKED[rank],
		verdictAtSpeed: rankAtSpeed === 0 ? 'unchecked' : RANKED[rankAtSpeed],
		worstAtSpeed: build(worstAt),
		worstOverRange: build(worst)
	};
}

/** A check is stale when older than the site's recheck interval. */
export function isStale(checkedAtMs: number, nowMs: number, recheckDays: number): boolean {
	const t = finite('checkedAtMs', checkedAtMs);
	const now = finite('nowMs', nowMs);
	const days = positive('recheckDays', recheckDays);
	return now - t > days * 86_400_000;
}
