/** Peak picking on a magnitude spectrum: local maxima ranked by prominence, with interpolation. */

export interface Peak {
	bin: number;
	height: number;
	/** height above the higher of the two bases (the lowest points to the nearest higher ground) */
	prominence: number;
}

/**
 * Local maxima in [from, to) whose height is at least `minHeight`, each with its prominence
 * (as scipy.signal.peak_prominences defines it: the height above the higher of the lowest points
 * between the peak and the nearest higher ground on each side). Linear time: nearest higher
 * samples from a monotonic stack, range minima from block minima.
 */
// work arrays kept between calls: a spectrum's peaks are sought several times per analysis, and
// allocating three index arrays of its length each time cost more than the search
let works: { prev: Int32Array; next: Int32Array; stack: Int32Array } | null = null;
function work(len: number) {
	if (!works || works.prev.length < len)
		works = { prev: new Int32Array(len), next: new Int32Array(len), stack: new Int32Array(len) };
	return works;
}
let blocksBuf: Float64Array | null = null;
function blockWork(count: number): Float64Array {
	if (!blocksBuf || blocksBuf.length < count) blocksBuf = new Float64Array(count);
	const b = blocksBuf.subarray(0, count);
	b.fill(Infinity);
	return b;
}

export function findPeaks(
	mag: ArrayLike<number>,
	from: number,
	to: number,
	minHeight: number,
	minSeparation = 1
): Peak[] {
	const n = mag.length;
	const lo = Math.max(1, from);
	const hi = Math.min(n - 1, to);
	const cands: number[] = [];
	const sep = Math.max(1, Math.floor(minSeparation));
	for (let k = lo; k < hi; k++) {
		const h = mag[k];
		if (h < minHeight || !(h > mag[k - 1] && h >= mag[k + 1])) continue;
		// a ripple on the flank of a taller peak within `minSeparation` bins is not a peak of its own
		let top = true;
		for (let j = Math.max(0, k - sep); j <= Math.min(n - 1, k + sep) && top; j++)
			if (mag[j] > h) top = false;
		if (top) cands.push(k);
	}
	if (cands.length === 0) return [];
	const a0 = lo - 1;
	const a1 = hi + 1;
	// a few candidates walk out to higher ground, keeping the lowest point on the way; a walk can run
	// down a whole train of side lobes, so beyond a budget the stacks below are cheaper
	if (cands.length <= 64) {
		return cands.map((k) => {
			const h = mag[k];
			let leftMin = h;
			for (let i = k - 1; i >= a0 && mag[i] <= h; i--) if (mag[i] < leftMin) leftMin = mag[i];
			let rightMin = h;
			for (let i = k + 1; i < a1 && mag[i] <= h; i++) if (mag[i] < rightMin) rightMin = mag[i];
			return { bin: k, height: h, prominence: h - Math.max(leftMin, rightMin) };
		});
	}
	// nearest strictly higher sample on each side within the searched range (monotonic stacks)
	const len = a1 - a0;
	const { prev, next, stack } = work(len);
	let top = 0;
	for (let i = 0; i < len; i++) {
		const v = mag[a0 + i];
		while (top > 0 && mag[a0 + stack[top - 1]] <= v) top--;
		prev[i] = top > 0 ? stack[top - 1] : -1;
		stack[top++] = i;
	}
	top = 0;
	for (let i = len - 1; i >= 0; i--) {
		const v = mag[a0 + i];
		while (top > 0 && mag[a0 + stack[top - 1]] <= v) top--;
		next[i] = top > 0 ? stack[top - 1] : len;
		stack[top++] = i;
	}
	const B = 256;
	const blocks = blockWork(Math.ceil(n / B));
	for (let i = a0; i < a1; i++) if (mag[i] < blocks[(i / B) | 0]) blocks[(i / B) | 0] = mag[i];
	const rangeMin = (a: number, b: number): number => {
		// min of mag[a..b], inclusive
		let m = Infinity;
		let i = a;
		while (i <= b && i % B !== 0) m = Math.min(m, mag[i++]);
		while (i + B - 1 <= b) {
			m = Math.min(m, blocks[i / B]);
			i += B;
		}
		while (i <= b) m = Math.min(m, mag[i++]);
		return m;
	};
	return cands.map((k) => {
		const h = mag[k];
		const leftMin = rangeMin(a0 + prev[k - a0] + 1, k);
		const rightMin = rangeMin(k, Math.min(a1 - 1, a0 + next[k - a0] - 1));
		return { bin: k, height: h, prominence: h - Math.max(leftMin, rightMin) };
	});
}

/**
 * Sub-bin peak position by fitting a parabola to the log magnitudes of the three bins around a
 * maximum (Gaussian interpolation; exact for a Gaussian peak, better than 1 % of a bin for the
 * Lorentzian of a lightly damped mode on a zero-padded grid). Returns the fractional bin.
 */
export function interpolatePeak(
	mag: ArrayLike<number>,
	bin: number
): { bin: number; height: number } {
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
export function halfPowerBins(
	mag: ArrayLike<number>,
	bin: number,
	height: number
): [number, number] | null {
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
