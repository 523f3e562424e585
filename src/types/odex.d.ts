// The part of odex's API the tests use (Hairer's ODEX; see the package README).
export class Solver {
	constructor(n: number);
	absoluteTolerance: number;
	relativeTolerance: number;
	maxSteps: number;
	solve(
		f: (x: number, y: number[]) => number[],
		x0: number,
		y0: number[],
		xEnd: number
	): { y: number[]; outcome: number };
}
