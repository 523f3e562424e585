/** Axis arithmetic for the speed-sweep plots: nice tick steps and a linear map. */
import { unwrapDeg } from '$lib/vibration/sweep';

/** Ticks at 1, 2 or 5 × 10ⁿ covering [lo, hi], about `count` of them. */
export function ticks(lo: number, hi: number, count = 5): number[] {
	if (!(hi > lo)) return [lo];
	const raw = (hi - lo) / count;
	const p = 10 ** Math.floor(Math.log10(raw));
	const step = [1, 2, 5, 10].map((m) => m * p).find((s) => s >= raw) ?? 10 * p;
	const out: number[] = [];
	for (let v = Math.ceil(lo / step) * step; v <= hi + 1e-9 * step; v += step)
		out.push(Number(v.toPrecision(12)));
	return out;
}

/** The linear map of [d0, d1] onto [r0, r1]. */
export const linear =
	(d0: number, d1: number, r0: number, r1: number) =>
	(v: number): number =>
		d1 === d0 ? (r0 + r1) / 2 : r0 + ((v - d0) / (d1 - d0)) * (r1 - r0);

/** An SVG path through (x, y) pairs, at most `max` of them (every k-th point kept). */
export function pathOf(xs: ArrayLike<number>, ys: ArrayLike<number>, max = 1500): string {
	const step = Math.max(1, Math.ceil(xs.length / max));
	let d = '';
	for (let i = 0; i < xs.length; i += step) {
		const x = xs[i];
		const y = ys[i];
		if (!Number.isFinite(x) || !Number.isFinite(y)) continue;
		d += `${d ? 'L' : 'M'}${x.toFixed(1)},${y.toFixed(1)}`;
	}
	return d;
}

/** A phase series (°) unwrapped so no step exceeds 180°, then shifted into 0–360° at its start. */
export function unwrap(p: ArrayLike<number>): number[] {
	const out = Array.from(unwrapDeg(p));
	const shift = out.length ? Math.floor(out[0] / 360) * 360 : 0;
	return out.map((v) => v - shift);
}
