/**
 * ODEX (a Gragg–Bulirsch–Stoer integrator from the registry, independent of Detune's analysis),
 * set up once for the tests' reference signals: a system y′ = rhs(t, y) from y0, sampled on the
 * grid t = i/fs for i = 0 … n−1.
 */
import { createRequire } from 'node:module';
import type * as Odex from 'odex';

// odex by require: the test runners map the name 'odex' to its type declaration (tsconfig paths)
const { Solver } = createRequire(import.meta.url)('odex/src/odex.js') as typeof Odex;

export type Rhs = (t: number, y: number[]) => number[];

export interface Tolerance {
	absolute?: number;
	relative?: number;
	maxSteps?: number;
}

function solver(dimension: number, tol: Tolerance) {
	const s = new Solver(dimension);
	s.absoluteTolerance = tol.absolute ?? 1e-12;
	s.relativeTolerance = tol.relative ?? 1e-10;
	s.maxSteps = tol.maxSteps ?? 1e6;
	return s;
}

/**
 * One solve over the whole record with dense output on the sample grid; `pick(t, y)` is what is
 * recorded at each sample. For smooth forcing (the integrator may step over a sample).
 */
export function sampled(
	rhs: Rhs,
	y0: number[],
	fs: number,
	n: number,
	pick: (t: number, y: number[]) => number,
	tol: Tolerance = {}
): Float64Array {
	const out = new Float64Array(n);
	const s = solver(y0.length, tol);
	s.denseOutput = true;
	let i = 0;
	s.solve(
		rhs,
		0,
		y0,
		(n - 1) / fs,
		s.grid(1 / fs, (t, y) => {
			if (i < n) out[i++] = pick(t, y);
		})
	);
	return out;
}

/**
 * A solve from each sample to the next, so no step is longer than a sample: for forcing that is
 * short beside a sample (a hammer pulse), which one long step could miss. `record(i, y)` sees the
 * state at every sample after the first (the first is y0).
 */
export function stepwise(
	rhs: Rhs,
	y0: number[],
	fs: number,
	n: number,
	record: (i: number, y: number[]) => void,
	tol: Tolerance = {}
): void {
	const s = solver(y0.length, tol);
	let y = y0;
	for (let i = 1; i < n; i++) {
		y = s.solve(rhs, (i - 1) / fs, y, i / fs).y;
		record(i, y);
	}
}

/** The state at T, from y0 at 0. */
export function stateAt(rhs: Rhs, y0: number[], T: number, tol: Tolerance = {}): number[] {
	return solver(y0.length, tol).solve(rhs, 0, y0, T).y;
}
