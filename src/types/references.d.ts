// Types for the reference packages the tests use; they ship none of their own.
declare module 'durand-kerner' {
	/** Roots of the polynomial with coefficients lowest power first: [re[], im[]]. */
	export default function findRoots(
		realCoefficients: number[],
		imagCoefficients?: number[] | null,
		iterations?: number,
		tolerance?: number,
		initialRe?: number[],
		initialIm?: number[]
	): [number[], number[]];
}
