/** A tiny benchmark harness: median of several timed runs, and a table of figures with their goals. */
import { performance } from 'node:perf_hooks';

export interface Figure {
	name: string;
	value: number;
	unit: string;
	/** the goal, in the same unit */
	goal?: number;
	/** 'max' when lower is better, 'min' when higher is better */
	goalKind?: 'max' | 'min';
	note?: string;
}

export function median(xs: number[]): number {
	const s = [...xs].sort((a, b) => a - b);
	const m = s.length >> 1;
	return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

export function percentile(xs: number[], p: number): number {
	const s = [...xs].sort((a, b) => a - b);
	return s[Math.min(s.length - 1, Math.max(0, Math.ceil((p / 100) * s.length) - 1))];
}

/** Runs `fn` `warmup` times untimed, then `runs` times, returning each duration in ms. */
export function time(fn: () => unknown, runs = 7, warmup = 2): number[] {
	for (let i = 0; i < warmup; i++) fn();
	const out: number[] = [];
	for (let i = 0; i < runs; i++) {
		const t0 = performance.now();
		fn();
		out.push(performance.now() - t0);
	}
	return out;
}

export function printTable(figures: Figure[]): void {
	const rows = figures.map((f) => {
		const ok =
			f.goal === undefined
				? ''
				: (f.goalKind ?? 'max') === 'max'
					? f.value <= f.goal
					: f.value >= f.goal;
		const ratio = f.goal === undefined || f.goal === 0 ? '' : (f.value / f.goal).toFixed(2);
		return [
			f.name,
			fmt(f.value),
			f.unit,
			f.goal === undefined ? '' : `${(f.goalKind ?? 'max') === 'max' ? '≤' : '≥'} ${fmt(f.goal)}`,
			ratio,
			ok === '' ? '' : ok ? 'met' : 'MISSED',
			f.note ?? ''
		];
	});
	const head = ['figure', 'value', 'unit', 'goal', 'value/goal', 'status', 'note'];
	const widths = head.map((h, i) => Math.max(h.length, ...rows.map((r) => String(r[i]).length)));
	const line = (r: (string | number)[]) => r.map((c, i) => String(c).padEnd(widths[i])).join('  ');
	console.log(line(head));
	console.log(widths.map((w) => '-'.repeat(w)).join('  '));
	for (const r of rows) console.log(line(r));
}

function fmt(v: number): string {
	if (Number.isInteger(v)) return String(v);
	if (Math.abs(v) >= 100) return v.toFixed(0);
	if (Math.abs(v) >= 1) return v.toFixed(2);
	return v.toPrecision(3);
}
