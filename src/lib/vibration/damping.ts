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

/** AF ≈ Q = 1/(2ζ), the small-damping relation (F5). */
export function amplificationFactorFromDamping(dampingRatio: number): number {
	return 1 / (2 * positive('dampingRatio', dampingRatio));
}

/** ζ ≈ 1/(2·AF), the inverse of {@link amplificationFactorFromDamping}. */
export function dampingFromAmplificationFactor(amplificationFactor: number): number {
	return 1 / (2 * positive('amplificationFactor', amplificationFactor));
}
