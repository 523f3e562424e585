/**
 * Speed sweep: a run-up or coast-down recorded with a tachometer. The record is cut where the
 * speed turns (a run-up then a trip gives one run-up and one coast-down), each order is tracked
 * over every revolution (signal/orders.ts), and each amplitude peak of a tracked order is a
 * resonance candidate: its speed N_c, its half-power speeds N₁ and N₂ (0.707 × peak), the
 * amplification factor AF = N_c / (N₂ − N₁) of API RP 684 (../shared/domain.md §1.2, [S2]) and
 * the phase change across it. A true resonance shows the phase swinging about 90° between N₁ and
 * N₂ (domain.md §6.2, [S]); a peak without it is flagged. The waterfall is the vibration
 * channel's spectrum over time, each row at the speed of its moment.
 */
import { positive, VibrationInputError } from './errors.ts';
import { trackOrders, type OrderTrack } from './signal/orders.ts';
import type { Revolutions } from './signal/tach.ts';
import { hannWindow, runMaxima, windowedAmplitude } from './signal/spectrum.ts';

export type SweepDirection = 'run-up' | 'coast-down';

export type ResonanceFlag =
	'sweep-too-fast' | 'few-revolutions' | 'tach-repair' | 'no-phase-change' | 'no-phase-reference';

export const RESONANCE_FLAG_TEXT: Record<ResonanceFlag, string> = {
	'sweep-too-fast':
		'The speed changed too fast for this resonance’s bandwidth: its peak is shifted and its AF too low. Sweep slower.',
	'few-revolutions':
		'Fewer than 8 revolutions across the half-power band: the peak and AF are coarse.',
	'tach-repair': 'Tachometer pulses were repaired or missing near this peak.',
	'no-phase-change':
		'The phase hardly changes across this peak: more likely a neighbour’s vibration or a forced response than a resonance.',
	'no-phase-reference':
		'The speed came from a speed channel, with no once-per-revolution mark: there is no phase to confirm the resonance.'
};

/**
 * The largest sweep rate for a resonance, as (df/dt)/Δf² with Δf its half-power bandwidth in Hz:
 * a slower sweep leaves the peak's speed and AF within a few percent of the steady response.
 * Common practice bounds the rate by the bandwidth squared; the figure 0.1 is ours, from ODEX runs
 * of an SDOF rotor (see sweep.spec.ts), not from a standard.
 */
export const MAX_SWEEP_RATE = 0.1;
/** Revolutions across the half-power band below which the peak is coarse (common practice). */
export const MIN_REVS_ACROSS = 8;
/** Phase change across the half-power band below which a peak is not taken as a resonance (°). */
export const MIN_PHASE_CHANGE_DEG = 45;
/** Peaks under this share of the order's largest amplitude in the segment are not candidates. */
const MIN_SHARE = 0.1;
const HALF_POWER = Math.SQRT1_2;
/** A peak must stand this many times the revolution-to-revolution scatter above zero. */
const SIGNIFICANCE = 8;

/**
 * The revolution-to-revolution scatter of an amplitude series: the robust spread (1.4826 × median
 * absolute value) of each value less the mean of its neighbours, ÷ √1.5 for that difference's own
 * variance. A smooth curve has next to none; an order with no content is all scatter.
 */
function scatter(a: ArrayLike<number>): number {
	const d: number[] = [];
	for (let i = 1; i + 1 < a.length; i++) d.push(Math.abs(a[i] - (a[i - 1] + a[i + 1]) / 2));
	if (d.length === 0) return 0;
	d.sort((x, y) => x - y);
	return (1.4826 * d[d.length >> 1]) / Math.sqrt(1.5);
}

export interface Resonance {
	order: number;
	direction: SweepDirection;
	/** speed at the amplitude peak (rpm) */
	criticalRpm: number;
	/** order × N_c / 60: the natural frequency this resonance shows (Hz) */
	frequencyHz: number;
	/** half-power speeds N₁ < N₂ (rpm) */
	n1Rpm: number;
	n2Rpm: number;
	/** N_c / (N₂ − N₁), API RP 684 */
	amplificationFactor: number;
	/** the half-power damping ratio (N₂ − N₁) / (2 N_c) = 1 / (2 AF) */
	dampingRatio: number;
	peakAmplitude: number;
	/** phase lag at the peak and its change from N₁ to N₂ (°) */
	phaseAtPeakDeg: number;
	phaseChangeDeg: number;
	/** revolutions between the half-power speeds */
	revsAcross: number;
	/** (df/dt)/Δf² at the peak */
	sweepRate: number;
	flags: ResonanceFlag[];
}

export interface SweepSegment {
	direction: SweepDirection;
	/** revolutions [fromRev, toRev] of the record */
	fromRev: number;
	toRev: number;
	fromRpm: number;
	toRpm: number;
	durationS: number;
	tracks: OrderTrack[];
	resonances: Resonance[];
}

export interface Waterfall {
	/** row times (s) and speeds (rpm) */
	timeS: number[];
	rpm: number[];
	/** column centre frequencies (Hz) */
	frequencyHz: number[];
	/** rows × columns of amplitude (peak, channel units), row-major */
	amplitude: Float32Array;
	resolutionHz: number;
	/** the FFTs it took, for the benchmark: count and length */
	ffts: number;
	nfft: number;
}

/** Mean of `x` over [i − h, i + h], clipped to the array. */
function movingMean(x: ArrayLike<number>, h: number): Float64Array {
	const out = new Float64Array(x.length);
	for (let i = 0; i < x.length; i++) {
		let s = 0;
		let c = 0;
		for (let j = Math.max(0, i - h); j <= Math.min(x.length - 1, i + h); j++) {
			s += x[j];
			c++;
		}
		out[i] = s / c;
	}
	return out;
}

function median3(x: ArrayLike<number>): Float64Array {
	const out = Float64Array.from(x);
	for (let i = 1; i + 1 < x.length; i++) {
		const a = x[i - 1];
		const b = x[i];
		const c = x[i + 1];
		out[i] = Math.max(Math.min(a, b), Math.min(Math.max(a, b), c));
	}
	return out;
}

/**
 * Where the speed turns: a zigzag over the smoothed per-revolution speed, a turn counting once the
 * speed has come back by 5 % of its range (at least 20 rpm). Pieces that change by less are
 * dwells, not sweeps, and are left out.
 */
export function sweepPieces(
	rpm: ArrayLike<number>
): { fromRev: number; toRev: number; direction: SweepDirection }[] {
	const n = rpm.length;
	if (n < 3) return [];
	const sm = movingMean(rpm, 4);
	let lo = Infinity;
	let hi = -Infinity;
	for (const v of sm) {
		lo = Math.min(lo, v);
		hi = Math.max(hi, v);
	}
	const h = Math.max(0.05 * (hi - lo), 20);
	const pivots = [0];
	let dir = 0;
	let ext = 0;
	for (let i = 1; i < n; i++) {
		const v = sm[i];
		if (dir === 0) {
			if (v - sm[pivots[0]] > h) dir = 1;
			else if (sm[pivots[0]] - v > h) dir = -1;
			ext = i;
		} else if (dir === 1) {
			if (v > sm[ext]) ext = i;
			else if (sm[ext] - v > h) {
				pivots.push(ext);
				dir = -1;
				ext = i;
			}
		} else if (v < sm[ext]) ext = i;
		else if (v - sm[ext] > h) {
			pivots.push(ext);
			dir = 1;
			ext = i;
		}
	}
	if (dir !== 0) pivots.push(ext);
	const out: { fromRev: number; toRev: number; direction: SweepDirection }[] = [];
	for (let p = 0; p + 1 < pivots.length; p++) {
		const a = pivots[p];
		const b = pivots[p + 1];
		if (Math.abs(sm[b] - sm[a]) < h || b - a < 3) continue;
		out.push({ fromRev: a, toRev: b, direction: sm[b] > sm[a] ? 'run-up' : 'coast-down' });
	}
	return out;
}

/** The speed where `a` crosses `level` between revolutions i and j (adjacent), interpolated. */
function crossing(a: Float64Array, rpm: ArrayLike<number>, i: number, j: number, level: number) {
	const f = a[j] === a[i] ? 0 : (level - a[i]) / (a[j] - a[i]);
	return { rpm: rpm[i] + f * (rpm[j] - rpm[i]), at: i + f * (j - i) };
}

/** The largest value, 0 for none (a loop: a long record's tracks are too long to spread). */
function largest(x: ArrayLike<number>): number {
	let top = 0;
	for (let i = 0; i < x.length; i++) top = Math.max(top, x[i]);
	return top;
}

function at(x: ArrayLike<number>, pos: number): number {
	const i = Math.floor(pos);
	const f = pos - i;
	return i + 1 < x.length ? x[i] + f * (x[i + 1] - x[i]) : x[i];
}

/** A phase series (°) unwrapped so no step from one point to the next exceeds 180°. */
export function unwrapDeg(p: ArrayLike<number>): Float64Array {
	const out = new Float64Array(p.length);
	let offset = 0;
	for (let i = 0; i < p.length; i++) {
		if (i > 0) {
			const d = p[i] + offset - out[i - 1];
			if (d > 180) offset -= 360;
			else if (d < -180) offset += 360;
		}
		out[i] = p[i] + offset;
	}
	return out;
}

/** The half-power walk from a peak in one direction: the crossing, or null (a higher point first, or the end). */
function walk(a: Float64Array, p: number, stepDir: 1 | -1, level: number): number | null {
	for (let j = p + stepDir; j >= 0 && j < a.length; j += stepDir) {
		if (a[j] > a[p]) return null;
		if (a[j] < level) return j;
	}
	return null;
}

/** The peaks of one tracked order over one sweep piece, each with N₁, N₂, AF, phase and flags. */
export function resonancesOf(
	track: OrderTrack,
	piece: { fromRev: number; toRev: number; direction: SweepDirection },
	revs: Pick<Revolutions, 'phaseReference' | 'repairs'>
): Resonance[] {
	const { fromRev, toRev, direction } = piece;
	const rpm = track.rpm.subarray(fromRev, toRev + 1);
	const time = track.timeS.subarray(fromRev, toRev + 1);
	const raw = track.amplitude.subarray(fromRev, toRev + 1);
	// candidates and half-power walks on a 3-point median (a stray revolution is not a peak); the
	// peak's own speed and height from the revolutions as measured
	const a = median3(raw);
	const phase = unwrapDeg(track.phaseDeg.subarray(fromRev, toRev + 1));
	const top = largest(a);
	const floor = SIGNIFICANCE * scatter(raw);
	const found: Resonance[] = [];
	const seen = new Set<string>();
	for (let p = 1; p + 1 < a.length; p++) {
		if (a[p] < MIN_SHARE * top || a[p] < floor) continue;
		let isMax = true;
		for (let j = Math.max(0, p - 3); j <= Math.min(a.length - 1, p + 3); j++)
			if (a[j] > a[p] || (a[j] === a[p] && j < p)) isMax = false;
		if (!isMax) continue;
		const vertex = peakOf(raw, rpm, p);
		const level = HALF_POWER * vertex.amplitude;
		const l = walk(a, p, -1, level);
		const r = walk(a, p, 1, level);
		// fewer than three revolutions between the crossings is a transient's beat, not a resonance;
		// a crossing at the piece's first or last revolution is not seen past it
		if (l === null || r === null || l === 0 || r === a.length - 1) continue;
		if (r - l < 4 || seen.has(`${l}:${r}`)) continue;
		seen.add(`${l}:${r}`);
		const left = crossing(a, rpm, l, l + 1, level);
		const right = crossing(a, rpm, r - 1, r, level);
		const n1 = Math.min(left.rpm, right.rpm);
		const n2 = Math.max(left.rpm, right.rpm);
		if (!(n2 > n1)) continue;
		const nc = vertex.rpm;
		const af = nc / (n2 - n1);
		const dPhase = Math.abs(at(phase, right.at) - at(phase, left.at));
		const dt = Math.abs(at(time, right.at) - at(time, left.at));
		const bandwidthHz = (track.order * (n2 - n1)) / 60;
		const sweepRate =
			dt > 0
				? (track.order * Math.abs(right.rpm - left.rpm)) / 60 / dt / bandwidthHz ** 2
				: Infinity;
		const flags: ResonanceFlag[] = [];
		if (sweepRate > MAX_SWEEP_RATE) flags.push('sweep-too-fast');
		const revsAcross = Math.abs(right.at - left.at);
		if (revsAcross < MIN_REVS_ACROSS) flags.push('few-revolutions');
		const t0 = Math.min(at(time, left.at), at(time, right.at)) - dt;
		const t1 = Math.max(at(time, left.at), at(time, right.at)) + dt;
		if (
			revs.repairs.repairedAtS.some((t) => t >= t0 && t <= t1) ||
			revs.repairs.gaps.some((g) => g.toS >= t0 && g.fromS <= t1)
		)
			flags.push('tach-repair');
		if (!revs.phaseReference) flags.push('no-phase-reference');
		else if (dPhase < MIN_PHASE_CHANGE_DEG) flags.push('no-phase-change');
		found.push({
			order: track.order,
			direction,
			criticalRpm: nc,
			frequencyHz: (track.order * nc) / 60,
			n1Rpm: n1,
			n2Rpm: n2,
			amplificationFactor: af,
			dampingRatio: 1 / (2 * af),
			peakAmplitude: vertex.amplitude,
			phaseAtPeakDeg: ((phase[p] % 360) + 360) % 360,
			phaseChangeDeg: dPhase,
			revsAcross,
			sweepRate,
			flags
		});
	}
	return found;
}

/**
 * The peak's speed and height: the vertex of the parabola through the tallest revolution near a
 * candidate and its two neighbours.
 */
function peakOf(
	a: ArrayLike<number>,
	rpm: ArrayLike<number>,
	p: number
): { rpm: number; amplitude: number } {
	let q = p;
	for (let j = Math.max(1, p - 2); j <= Math.min(a.length - 2, p + 2); j++) if (a[j] > a[q]) q = j;
	q = Math.min(a.length - 2, Math.max(1, q));
	const [x0, x1, x2] = [rpm[q - 1], rpm[q], rpm[q + 1]];
	const [y0, y1, y2] = [a[q - 1], a[q], a[q + 1]];
	const d = (x0 - x1) * (x0 - x2) * (x1 - x2);
	const flat = { rpm: x1, amplitude: y1 };
	if (d === 0) return flat;
	const A = (x2 * (y1 - y0) + x1 * (y0 - y2) + x0 * (y2 - y1)) / d;
	const B = (x2 * x2 * (y0 - y1) + x1 * x1 * (y2 - y0) + x0 * x0 * (y1 - y2)) / d;
	if (!(A < 0)) return flat;
	const v = -B / (2 * A);
	if (!(v >= Math.min(x0, x2) && v <= Math.max(x0, x2))) return flat;
	const C = y1 - A * x1 * x1 - B * x1;
	return { rpm: v, amplitude: A * v * v + B * v + C };
}

/** The speed at time t, from the revolutions' middle times (binary search, linear between). */
function speedAt(timeS: Float64Array, rpm: Float64Array, t: number): number {
	let lo = 0;
	let hi = timeS.length - 1;
	if (t <= timeS[lo]) return rpm[lo];
	if (t >= timeS[hi]) return rpm[hi];
	while (hi - lo > 1) {
		const m = (lo + hi) >> 1;
		if (timeS[m] <= t) lo = m;
		else hi = m;
	}
	return rpm[lo] + ((t - timeS[lo]) / (timeS[hi] - timeS[lo])) * (rpm[hi] - rpm[lo]);
}

/**
 * The waterfall: Hann-windowed spectra of about half a second (the largest power of two of samples
 * not over one second), at most `rows` of them evenly over the record, up to `topHz`, each reduced
 * to at most `columns` by the largest bin of each run (so a narrow line survives).
 */
export function waterfall(
	x: ArrayLike<number>,
	sampleRateHz: number,
	speed: { timeS: Float64Array; rpm: Float64Array },
	topHz: number,
	rows = 120,
	columns = 320
): Waterfall {
	const fs = positive('sampleRateHz', sampleRateHz);
	let nfft = 256;
	while (nfft * 2 <= Math.min(fs, x.length)) nfft *= 2;
	if (x.length < nfft)
		throw new VibrationInputError('vibration channel', `at least ${nfft} samples`, x.length);
	const hop = Math.max(nfft / 2, Math.floor((x.length - nfft) / Math.max(1, rows - 1)));
	const df = fs / nfft;
	const kTop = Math.min(nfft / 2, Math.max(2, Math.round(Math.min(topHz, fs / 2) / df)));
	const per = Math.max(1, Math.ceil(kTop / columns));
	const cols = Math.ceil(kTop / per);
	const w = hannWindow(nfft);
	const timeS: number[] = [];
	const rpm: number[] = [];
	const out: Float32Array[] = [];
	for (let from = 0; from + nfft <= x.length; from += hop) {
		const mag = windowedAmplitude(x, from, w, nfft);
		out.push(Float32Array.from(runMaxima(mag, 0, kTop, per)));
		const t = (from + nfft / 2) / fs;
		timeS.push(t);
		rpm.push(speedAt(speed.timeS, speed.rpm, t));
	}
	const amplitude = new Float32Array(out.length * cols);
	out.forEach((row, i) => amplitude.set(row, i * cols));
	return {
		timeS,
		rpm,
		frequencyHz: Array.from({ length: cols }, (_, c) => (c * per + (per - 1) / 2) * df),
		amplitude,
		resolutionHz: df,
		ffts: out.length,
		nfft
	};
}

/** A peak this many times taller on another order at the same speed is where a small one leaks from. */
const LEAK_RATIO = 20;
/** Peaks under this share of the piece's tallest order (−34 dB) are not worth a margin (common practice). */
const MIN_SHARE_OF_ALL = 0.02;

/**
 * Drops the echoes of a strong resonance on the other tracked orders. On a ramp the speed changes
 * within a turn, so the orders are not quite orthogonal over it and a tall 1× peak shows, about
 * 1 % as tall, on 2× or a blade pass at the very same speed. A candidate within the half-power
 * band of a peak on another order at least 20 times taller is taken as that leak. After a fast
 * pass the structure rings at its own frequency, which is no order: its small echoes on the other
 * orders are dropped by the share of the piece's tallest amplitude.
 */
function withoutLeaks(found: Resonance[], tallest: number): Resonance[] {
	return found.filter(
		(r) =>
			r.peakAmplitude >= MIN_SHARE_OF_ALL * tallest &&
			!found.some(
				(o) =>
					o.order !== r.order &&
					o.peakAmplitude >= LEAK_RATIO * r.peakAmplitude &&
					r.criticalRpm >= o.n1Rpm &&
					r.criticalRpm <= o.n2Rpm
			)
	);
}

export interface SweepResult {
	pieces: SweepSegment[];
	waterfall: Waterfall;
	revolutions: number;
	minRpm: number;
	maxRpm: number;
}

/**
 * The whole analysis of one vibration channel against revolutions from its tachometer: pieces,
 * orders tracked over each, resonances of each order, and the waterfall up to 2.5 × the highest
 * tracked order's frequency at the top speed.
 */
export function analyzeSweep(
	x: ArrayLike<number>,
	sampleRateHz: number,
	revs: Revolutions,
	orders: readonly number[]
): SweepResult {
	if (revs.rpm.length < 3)
		throw new VibrationInputError('tachometer', 'at least three revolutions', revs.rpm.length);
	const tracks = trackOrders(x, sampleRateHz, revs, orders);
	const pieces = sweepPieces(revs.rpm).map((piece) => {
		const sub = tracks.map((t) => ({
			order: t.order,
			timeS: t.timeS.slice(piece.fromRev, piece.toRev + 1),
			rpm: t.rpm.slice(piece.fromRev, piece.toRev + 1),
			amplitude: t.amplitude.slice(piece.fromRev, piece.toRev + 1),
			phaseDeg: t.phaseDeg.slice(piece.fromRev, piece.toRev + 1)
		}));
		return {
			...piece,
			fromRpm: revs.rpm[piece.fromRev],
			toRpm: revs.rpm[piece.toRev],
			durationS: revs.endS[piece.toRev] - revs.startS[piece.fromRev],
			tracks: sub,
			resonances: withoutLeaks(
				tracks.flatMap((t) => resonancesOf(t, piece, revs)),
				Math.max(0, ...sub.map((t) => largest(t.amplitude)))
			).sort((p, q) => p.criticalRpm - q.criticalRpm)
		};
	});
	let lo = Infinity;
	let hi = 0;
	for (const v of revs.rpm) {
		lo = Math.min(lo, v);
		hi = Math.max(hi, v);
	}
	const mid = tracks[0].timeS;
	return {
		pieces,
		waterfall: waterfall(
			x,
			sampleRateHz,
			{ timeS: mid, rpm: revs.rpm },
			(2.5 * Math.max(...orders) * hi) / 60
		),
		revolutions: revs.rpm.length,
		minRpm: lo,
		maxRpm: hi
	};
}
