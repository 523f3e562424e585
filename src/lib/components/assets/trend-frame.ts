/**
 * The frame both asset-sheet trends draw on: time across (at least a day wide), a value up from 0
 * to `yMax`, in an SVG of W × H with the given padding.
 */
export interface TrendPad {
	l: number;
	r: number;
	t: number;
	b: number;
}

export interface TrendFrame {
	W: number;
	H: number;
	pad: TrendPad;
	t0: number;
	t1: number;
	yMax: number;
	sx: (t: number) => number;
	sy: (v: number) => number;
	/** an SVG path through the points, in time order as given */
	path: (points: { at: number; v: number }[]) => string;
}

export function trendFrame(
	times: readonly number[],
	yMax: number,
	W: number,
	H: number,
	pad: TrendPad
): TrendFrame {
	const t0 = times.length ? Math.min(...times) : 0;
	const t1 = Math.max(t0 + 86_400_000, times.length ? Math.max(...times) : 0);
	const sx = (t: number) => pad.l + ((t - t0) / (t1 - t0)) * (W - pad.l - pad.r);
	const sy = (v: number) => H - pad.b - (v / yMax) * (H - pad.t - pad.b);
	const path = (points: { at: number; v: number }[]) =>
		points.map((p, i) => `${i ? 'L' : 'M'}${sx(p.at).toFixed(1)},${sy(p.v).toFixed(1)}`).join(' ');
	return { W, H, pad, t0, t1, yMax, sx, sy, path };
}
