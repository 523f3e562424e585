/**
 * Damping from measured data: log decrement (F4), half-power bandwidth (F5) and the amplification
 * factor. Sources: Rao §2.6 (logarithmic decrement), Inman §2.x / Ewins, Modal Testing §4.3
 * (half-power points), API RP 684 (AF by the half-power method).
 */
import {
	finite,
	integerAtLeast,
	nonEmpty,
	positive,
	VibrationInputError,
	nonNegative
} from './errors.ts';

export interface DampingEstimate {
	logDecrement: number;
	dampingRatio: number;
}

/** ζ = δ/√(4π² + δ²), the exact inverse of δ = 2πζ/√(1−ζ²) (F4). */
export function dampingRatioFromLogDecrement(logDecrement: number): number {
	const d = nonNegative('logDecrement', logDecrement);
	return d / Math.sqrt(4 * Math.PI * Math.PI + d * d);
}

/** δ = 2πζ/√(1−ζ²) for 0 ≤ ζ < 1 (F4). */
export function logDecrementFromDampingRatio(dampingRatio: number): number {
	const z = finite('dampingRatio', dampingRatio);
	if (z < 0 || z >= 1)
		throw new VibrationInputError(
			'dampingRatio',
			'at least 0 and below 1 (only an underdamped system rings down)',
			z
		);
	return (2 * Math.PI * z) / Math.sqrt(1 - z * z);
}

/**
 * From successive positive peaks, one per cycle: δ is the least-squares slope of ln(x_i) against
 * the cycle number i (for an exact exponential decay this equals ln(x_0/x_n)/n, F4; with noise
 * it uses every peak rather than only the first and last).
 */
export function dampingFromLogDecrement(peaks: number[]): DampingEstimate {
	const list = nonEmpty('peaks', peaks);
	if (list.length < 2)
		throw new VibrationInputError('peaks', 'a list of at least two successive peaks', list);
	const logs = list.map((p, i) => Math.log(positive(`peaks[${i}]`, p)));
	const n = logs.length;
	const meanI = (n - 1) / 2;
	const meanL = logs.reduce((a, b) => a + b, 0) / n;
	let num = 0;
	let den = 0;
	for (let i = 0; i < n; i++) {
		num += (i - meanI) * (logs[i] - meanL);
		den += (i - meanI) ** 2;
	}
	const delta = -num / den;
	if (delta < 0)
		throw new VibrationInputError(
			'peaks',
			'decaying (the peaks grow, so this is not a free ring-down)',
			list
		);
	return { logDecrement: delta, dampingRatio: dampingRatioFromLogDecrement(delta) };
}

/**
 * From two peaks `cycles` apart: δ = ln(x_first/x_later)/cycles (F4). Peak 1 and peak 100 are 99
 * cycles apart: use {@link dampingFromPeakNumbers} when you have peak numbers.
 */
export function dampingFromPeaksApart(
	first: number,
	later: number,
	cycles: number
): DampingEstimate {
	const a = positive('first peak', first);
	const b = positive('later peak', later);
	const n = integerAtLeast('cycles', cycles, 1);
	if (b > a)
		throw new VibrationInputError(
			'later peak',
			'no larger than the first peak in a free ring-down',
			b
		);
	const delta = Math.log(a / b) / n;
	return { logDecrement: delta, dampingRatio: dampingRatioFromLogDecrement(delta) };
}

/** From peak number i with amplitude x_i and peak number j > i with x_j: cycles = j − i. */
export function dampingFromPeakNumbers(
	a: { peak: number; amplitude: number },
	b: { peak: number; amplitude: number }
): DampingEstimate {
	const i = integerAtLeast('first peak number', a.peak, 0);
	const j = integerAtLeast('later peak number', b.peak, 0);
	if (j <= i)
		throw new VibrationInputError(
			'later peak number',
			`greater than the first peak number ${i}`,
			j
		);
	return dampingFromPeaksApart(a.amplitude, b.amplitude, j - i);
}

/**
 * Half-power bandwidth: ζ ≈ (f2 − f1)/(2 f_n), Q = f_n/(f2 − f1) (F5; the API AF for a
 * rotor). f1 < f_n < f2 are where the response is 1/√2 of the peak.
 */
export function dampingFromHalfPower(
	naturalHz: number,
	lowerHz: number,
	upperHz: number
): { dampingRatio: number; qFactor: number } {
	const fn = positive('naturalHz', naturalHz);
	const f1 = positive('lowerHz', lowerHz);
	const f2 = positive('upperHz', upperHz);
	if (!(f1 < fn && fn < f2))
		throw new VibrationInputError(
			'half-power points',
			`on either side of the peak (${f1} < ${fn} < ${f2})`,
			[f1, f2]
		);
	const bw = f2 - f1;
	return { dampingRatio: bw / (2 * fn), qFactor: fn / bw };
}

/** What a response measures, which sets the shape of its peak around a mode. */
export type ResponseKind = 'displacement' | 'velocity' | 'acceleration';

/**
 * ζ and f_n from the half-power points f1 < f2 of a single mode's response, exactly (no small-ζ
 * approximation), for the quantity measured. With u = (f/f_n)²:
 * - displacement, |H|² = 1/((1−u)² + 4ζ²u): the points are at u = 1 − 2ζ² ± 2ζ√(1−ζ²), so with
 *   q = (f2² − f1²)/(f2² + f1²) = 2ζ√(1−ζ²)/(1 − 2ζ²), ζ² = (1 − 1/√(1+q²))/2 and
 *   f_n² = (f1² + f2²)/(2(1 − 2ζ²));
 * - acceleration, |A| = u|H|: in s = f_n/f it is the displacement form, so the same q gives the
 *   same ζ, and f_n² = 2(1 − 2ζ²)/(1/f1² + 1/f2²);
 * - velocity, |Y| = √u|H|: 1/r − r = ±2ζ at the points, so exactly ζ = (f2 − f1)/(2√(f1·f2)) and
 *   f_n = √(f1·f2).
 * The displacement and acceleration forms have no lower point above ζ = 1/√(2(2+√2)) ≈ 0.383
 * (derived here; the curves are the standard SDOF receptance, mobility and accelerance).
 */
export function halfPowerExact(
	lowerHz: number,
	upperHz: number,
	kind: ResponseKind = 'acceleration'
): { dampingRatio: number; naturalHz: number } {
	const f1 = positive('lowerHz', lowerHz);
	const f2 = positive('upperHz', upperHz);
	if (!(f1 < f2))
		throw new VibrationInputError('half-power points', `in order (${f1} < ${f2})`, [f1, f2]);
	if (kind === 'velocity') {
		const fn = Math.sqrt(f1 * f2);
		return { dampingRatio: (f2 - f1) / (2 * fn), naturalHz: fn };
	}
	const q = (f2 * f2 - f1 * f1) / (f2 * f2 + f1 * f1);
	// 1 − 1/√(1+q²) loses digits for small q: the same as q²/(√(1+q²)(1 + √(1+q²)))
	const root = Math.sqrt(1 + q * q);
	const z2 = (q * q) / (2 * root * (1 + root));
	const fn2 =
		kind === 'displacement'
			? (f1 * f1 + f2 * f2) / (2 * (1 - 2 * z2))
			: (2 * (1 - 2 * z2)) / (1 / (f1 * f1) + 1 / (f2 * f2));
	return { dampingRatio: Math.sqrt(z2), naturalHz: Math.sqrt(fn2) };
}

/** AF ≈ Q = 1/(2ζ), the small-damping relation (F5). */
export function amplificationFactorFromDamping(dampingRatio: number): number {
	return 1 / (2 * positive('dampingRatio', dampingRatio));
}

/** ζ ≈ 1/(2·AF), the inverse of {@link amplificationFactorFromDamping}. */
export function dampingFromAmplificationFactor(amplificationFactor: number): number {
	return 1 / (2 * positive('amplificationFactor', amplificationFactor));
}
