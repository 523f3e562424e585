/**
 * Natural-frequency estimates for the structures crews meet: a machine on springs, a pipe or
 * bracket as a beam, a shaft with a disc. SI inputs, Hz out. Formulas F1, F2, F10–F14 in
 * ../shared/domain.md; each function names its source.
 */
import { STANDARD_GRAVITY } from './units.ts';
import { integerAtLeast, positive, nonNegative, VibrationInputError } from './errors.ts';

const TWO_PI = 2 * Math.PI;

/**
 * f = (1/2π)·√(g/δ) from the static deflection δ (m) under the supported weight.
 * Source: Rao, Mechanical Vibrations §2.2 (F2); equals 15.76/√δ[mm] Hz.
 */
export function staticDeflectionFrequencyHz(deflectionM: number): number {
	const d = positive('deflectionM', deflectionM);
	return Math.sqrt(STANDARD_GRAVITY / d) / TWO_PI;
}

/** f = (1/2π)·√(k/m). Source: Rao §2.2, Inman §1.1 (F1). */
export function massSpringFrequencyHz(stiffness: number, mass: number): number {
	return Math.sqrt(positive('stiffness', stiffness) / positive('mass', mass)) / TWO_PI;
}

/** Bending stiffness and mass of a uniform Euler–Bernoulli beam. */
export interface Beam {
	/** Young's modulus E, Pa */
	youngsModulus: number;
	/** second moment of area I about the bending axis, m⁴ */
	secondMoment: number;
	/** mass per unit length μ, kg/m */
	massPerLength: number;
	/** length L, m */
	length: number;
}

/**
 * λL for the first modes. Cantilever: roots of cos λL·cosh λL = −1; fixed–fixed (and free–free):
 * cos λL·cosh λL = 1; simply supported: iπ. Source: Blevins, Formulas for Natural Frequency and
 * Mode Shape, table 8-1 (F10–F12). Beyond the tabulated roots the asymptotes (2i−1)π/2 and
 * (2i+1)π/2 are exact to better than 1e-7.
 */
const CANTILEVER_LAMBDA = [1.875104069, 4.694091133, 7.854757438, 10.99554073, 14.13716839];
const FIXED_FIXED_LAMBDA = [4.730040745, 7.853204624, 10.99560784, 14.13716549, 17.27875966];

export type BeamSupport = 'cantilever' | 'simply-supported' | 'fixed-fixed';

export function beamLambda(support: BeamSupport, mode: number): number {
	const i = integerAtLeast('mode', mode, 1);
	if (support === 'simply-supported') return i * Math.PI;
	if (support === 'cantilever')
		return i <= CANTILEVER_LAMBDA.length ? CANTILEVER_LAMBDA[i - 1] : ((2 * i - 1) * Math.PI) / 2;
	return i <= FIXED_FIXED_LAMBDA.length ? FIXED_FIXED_LAMBDA[i - 1] : ((2 * i + 1) * Math.PI) / 2;
}

/** f_i = (λ_iL)²/(2πL²)·√(EI/μ), the first `modes` bending frequencies (F10–F12). */
export function beamFrequenciesHz(beam: Beam, support: BeamSupport, modes = 3): number[] {
	const E = positive('youngsModulus', beam.youngsModulus);
	const I = positive('secondMoment', beam.secondMoment);
	const mu = positive('massPerLength', beam.massPerLength);
	const L = positive('length', beam.length);
	const n = integerAtLeast('modes', modes, 1);
	const base = Math.sqrt((E * I) / (mu * L ** 4)) / TWO_PI;
	return Array.from({ length: n }, (_, k) => beamLambda(support, k + 1) ** 2 * base);
}

export const cantileverFrequenciesHz = (beam: Beam, modes = 3) =>
	beamFrequenciesHz(beam, 'cantilever', modes);
export const simplySupportedFrequenciesHz = (beam: Beam, modes = 3) =>
	beamFrequenciesHz(beam, 'simply-supported', modes);
export const fixedFixedFrequenciesHz = (beam: Beam, modes = 3) =>
	beamFrequenciesHz(beam, 'fixed-fixed', modes);

/**
 * Cantilever carrying a tip mass M, by Rayleigh's method: k = 3EI/L³, m_eff = M + (33/140)·m_beam.
 * Source: Rao §2.8 (Rayleigh's energy method, effective mass of a cantilever) (F13). With M = 0 it
 * over-estimates the exact first mode by 1.47 %; with M ≥ m_beam/2 the error is below 0.2 %.
 */
export function cantileverTipMassFrequencyHz(input: {
	youngsModulus: number;
	secondMoment: number;
	length: number;
	beamMass: number;
	tipMass: number;
}): number {
	const E = positive('youngsModulus', input.youngsModulus);
	const I = positive('secondMoment', input.secondMoment);
	const L = positive('length', input.length);
	const mb = nonNegative('beamMass', input.beamMass);
	const M = nonNegative('tipMass', input.tipMass);
	const mEff = M + (33 / 140) * mb;
	if (mEff <= 0) throw new VibrationInputError('beamMass + tipMass', 'greater than zero', mb + M);
	return Math.sqrt((3 * E * I) / L ** 3 / mEff) / TWO_PI;
}

/** Torsional stiffness of a solid round shaft, k_t = G·(πd⁴/32)/L, N·m/rad (F14; Rao §2.2). */
export function shaftTorsionalStiffness(input: {
	shearModulus: number;
	diameter: number;
	length: number;
}): number {
	const G = positive('shearModulus', input.shearModulus);
	const d = positive('diameter', input.diameter);
	const L = positive('length', input.length);
	return (G * Math.PI * d ** 4) / 32 / L;
}

/** Shaft (massless) with one disc of polar inertia J: f = (1/2π)√(k_t/J) (F14). */
export function shaftDiscFrequencyHz(torsionalStiffness: number, inertia: number): number {
	return (
		Math.sqrt(positive('torsionalStiffness', torsionalStiffness) / positive('inertia', inertia)) /
		TWO_PI
	);
}

/**
 * Two discs J1, J2 on a massless shaft k_t, free at both ends: the non-zero mode
 * ω = √(k_t(J1 + J2)/(J1·J2)) (F14; Rao §6.4, two-rotor system).
 */
export function twoDiscFrequencyHz(
	torsionalStiffness: number,
	inertia1: number,
	inertia2: number
): number {
	const k = positive('torsionalStiffness', torsionalStiffness);
	const j1 = positive('inertia1', inertia1);
	const j2 = positive('inertia2', inertia2);
	return Math.sqrt((k * (j1 + j2)) / (j1 * j2)) / TWO_PI;
}

export interface DiscOnShaft {
	/** the disc's mass, kg */
	mass: number;
	/** its distance from the left bearing, m (strictly between the bearings) */
	position: number;
}

/**
 * Deflection at x under a unit load at a on a simply supported shaft of length L (the influence
 * coefficient, m/N): for x ≤ a, α = b·x·(L² − b² − x²)/(6EIL) with b = L − a; symmetric in x, a.
 * Source: the beam-deflection table of any strength-of-materials handbook (Roark, simply
 * supported beam with an intermediate load; from memory).
 */
function influence(x: number, a: number, L: number, EI: number): number {
	const [p, q] = x <= a ? [x, a] : [a, x];
	const b = L - q;
	return (b * p * (L * L - b * b - p * p)) / (6 * EI * L);
}

/**
 * The first bending (lateral) natural frequency of a massless shaft between two simple bearings
 * carrying discs, two ways that bracket it:
 * - Dunkerley (a lower bound): 1/ω² = Σ m_i·α_ii, each disc alone on the shaft;
 * - Rayleigh with the static-deflection shape (an upper bound): y_i = g·Σ_j α_ij·m_j and
 *   ω² = g·Σ m_i·y_i / Σ m_i·y_i².
 * Source: Rao, Mechanical Vibrations, Dunkerley's formula and Rayleigh's method (multi-rotor
 * shaft); Den Hartog, Mechanical Vibrations (from memory). The shaft's own mass is left out: add
 * a disc for it, or read it as a further small lowering.
 */
export function shaftWithDiscsHz(
	shaft: { youngsModulus: number; secondMoment: number; length: number },
	discs: readonly DiscOnShaft[]
): { dunkerleyHz: number; rayleighHz: number } {
	const EI =
		positive('youngsModulus', shaft.youngsModulus) * positive('secondMoment', shaft.secondMoment);
	const L = positive('length', shaft.length);
	if (!Array.isArray(discs) || discs.length === 0)
		throw new VibrationInputError('discs', 'at least one disc', discs);
	const d = discs.map((disc, i) => {
		const m = positive(`discs[${i}].mass`, disc.mass);
		const a = positive(`discs[${i}].position`, disc.position);
		if (a >= L)
			throw new VibrationInputError(
				`discs[${i}].position`,
				`between the bearings (below ${L} m)`,
				a
			);
		return { m, a };
	});
	let flexSum = 0;
	for (const { m, a } of d) flexSum += m * influence(a, a, L, EI);
	const y = d.map(
		({ a }) => STANDARD_GRAVITY * d.reduce((s, o) => s + o.m * influence(a, o.a, L, EI), 0)
	);
	let num = 0;
	let den = 0;
	d.forEach(({ m }, i) => {
		num += m * y[i];
		den += m * y[i] * y[i];
	});
	return {
		dunkerleyHz: 1 / Math.sqrt(flexSum) / TWO_PI,
		rayleighHz: Math.sqrt((STANDARD_GRAVITY * num) / den) / TWO_PI
	};
}

/** Section helpers for the calculators: I of a rectangle b×h bending across h, b·h³/12. */
export const rectangleSecondMoment = (width: number, height: number): number =>
	(positive('width', width) * positive('height', height) ** 3) / 12;

/** I of a round tube (solid when inner = 0), π(D⁴ − d⁴)/64. */
export function tubeSecondMoment(outerDiameter: number, innerDiameter = 0): number {
	const D = positive('outerDiameter', outerDiameter);
	const d = nonNegative('innerDiameter', innerDiameter);
	if (d >= D) throw new VibrationInputError('innerDiameter', 'smaller than outerDiameter', d);
	return (Math.PI * (D ** 4 - d ** 4)) / 64;
}
