// The part of odex's API the tests use (Hairer's ODEX; see the package README).
export type OutputFunction = (
	nr: number,
	xOld: number,
	x: number,
	y: number[],
	dense: (c: number, x: number) => number
) => boolean | void;
export class Solver {
	constructor(n: number);
	absoluteTolerance: number;
	relativeTolerance: number;
	maxSteps: number;
	denseOutput: boolean;
	grid(dt: number, out: (xOut: number, yOut: number[]) => unknown): OutputFunction;
	solve(
		f: (x: number, y: number[]) => number[],
		x0: number,
		y0: number[],
		xEnd: number,
		solOut?: OutputFunction
	): { y: number[]; outcome: number };
}
