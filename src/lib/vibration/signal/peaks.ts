/** Peak picking on a magnitude spectrum: local maxima ranked by prominence, with interpolation. */

export interface Peak {
	bin: number;
	height: number;
	/** height above the higher of the two bases (the lowest points to the nearest higher ground) */
	prominence: number;
}

/**
 * Local maxima in [from, to) whose height is at least `minHeight`, each with its prominence
 * (as scipy.signal.peak_prominences defines it). Only tall-enough maxima are scanned, so noise
 * does not make this quadratic.
 */
export function findPeaks(mag: ArrayLike<number>, from: number, to: number, minHeight: number): Peak[] {
	const out: Peak[] = [];
	const lo = Math.max(1, from);
	const hi = Math.min(mag.length - 1, to);
	for (let k = lo; k < hi; k++) {
		const h = mag[k];
		if (h < minHeight || !(h > mag[k - 1] && h >= mag[k + 1])) continue;
		let leftMin = h;
		for (let i = k - 1; i >= 0 && mag[i] <= h; i--) if (mag[i] < leftMin) leftMin = mag[i];
		let rightMin = h;
		for (let i = k + 1; i < mag.length && mag[i] <= h; i++) {
			if (mag[i] < rightMin) rightMin = mag[i];
			if (mag[i] === h && i > k) break;
		}
		out.push({ bin: k, height: h, prominence: h - Math.max(leftMin, rightMin) });
	}
	return out;
}

/**
 * Sub-bin peak position by fitting a parabola to the log magnitudes of the three bins around a
 * maximum (Gaussian interpolation; exact for a Gaussian peak, better than 1 % of a bin for the
 * Lorentzian of a lightly damped mode on a zero-padded grid). Returns the fractional bin.
 */
export function interpolatePeak(mag: ArrayLike<number>, bin: number): { bin: number; height: number } {
	if (bin <= 0 || bin >= mag.length - 1) return { bin, height: mag[bin] };
	const a = Math.log(Math.max(mag[bin - 1], 1e-300));
	const b = Math.log(Math.max(mag[bin], 1e-300));
	const c = Math.log(Math.max(mag[bin + 1], 1e-300));
	const den = a - 2 * b + c;
	if (den >= 0) return { bin, height: mag[bin] };
	const p = (0.5 * (a - c)) / den;
	return { bin: bin + p, height: Math.exp(b - 0.25 * (a - c) * p) };
}

/**
 * The half-power points around a peak: where the magnitude falls to height/√2 on each side, by
 * linear interpolation between bins. Null on a side where the curve rises again (another mode)
 * before reaching half power.
 */
export function halfPowerBins(mag: ArrayLike<number>, bin: number, height: number): [number, number] | null {
	const target = height / Math.SQRT2;
	let left: number | null = null;
	for (let i = bin; i > 0; i--) {
		if (mag[i - 1] > mag[i] * 1.05 && mag[i] > target) return null;
		if (mag[i - 1] <= target) {
			left = i - 1 + (target - mag[i - 1]) / (mag[i] - mag[i - 1]);
			break;
		}
	}
	let right: number | null = null;
	for (let i = bin; i < mag.length - 1; i++) {
		if (mag[i + 1] > mag[i] * 1.05 && mag[i] > target) return null;
		if (mag[i + 1] <= target) {
			right = i + (mag[i] - target) / (mag[i] - mag[i + 1]);
			break;
		}
	}
	return left === null || right === null ? null : [left, right];
}
