/** Bisection on a sign change, for tests that need an independent root of a published equation. */
export function bisect(f: (x: number) => number, lo: number, hi: number): number {
	let a = lo;
	let b = hi;
	for (let i = 0; i < 200; i++) {
		const m = (a + b) / 2;
		if (Math.sign(f(m)) === Math.sign(f(a))) a = m;
		else b = m;
	}
	return (a + b) / 2;
}
