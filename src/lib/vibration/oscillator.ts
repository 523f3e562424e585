/**
 * The damped single-degree-of-freedom oscillator in standard form
 *   x'' + 2ζω₀x' + ω₀²x = F(t)/m,   ω₀ = √(k/m),   2ζω₀ = c/m.
 * Formulas: Rao, Mechanical Vibrations, ch. 2–3; Inman, Engineering Vibration, ch. 1–2 (F1, F3, F4,
 * F6–F9 in ../shared/domain.md). The same mathematics covers a torsional shaft–disc (J, k_t, c_t)
 * and a series RLC circuit (L, 1/C, R).
 */
import { finite, nonNegative, positive, VibrationInputError } from './errors.ts';

export type Regime = 'undamped' | 'underdamped' | 'critical' | 'overdamped';

export interface Complex {
	re: number;
	im: number;
}

export interface Oscillator {
	/** undamped natural angular frequency ω₀, rad/s */
	omega0: number;
	/** undamped natural frequency f₀ = ω₀/2π, Hz */
	naturalFrequencyHz: number;
	/** damping ratio ζ = c / (2√(km)) */
	dampingRatio: number;
	regime: Regime;
	/** roots of s² + 2ζω₀s + ω₀² = 0, the first with the larger real part (or +im) */
	roots: [Complex, Complex];
	/** damped natural frequency ω_d/2π, Hz, where the free response oscillates; null otherwise */
	dampedFrequencyHz: number | null;
	/** Q = 1/(2ζ) for an underdamped system; null when undamped (unbounded) or not oscillating */
	qFactor: number | null;
	/** δ = 2πζ/√(1−ζ²) per cycle; 0 when undamped; null when the response does not oscillate */
	logDecrement: number | null;
}

/** |ζ − 1| below this counts as critical damping: floats rarely hit 1 exactly. */
export const CRITICAL_TOLERANCE = 1e-9;
/** ζ below this counts as undamped: Q = 1/(2ζ) would be beyond any physical system. */
export const UNDAMPED_TOLERANCE = 1e-12;

/** Oscillator from mass (kg), stiffness (N/m) and viscous damping (N·s/m). */
export function oscillator(input: {
	mass: number;
	stiffness: number;
	damping?: number;
}): Oscillator {
	if (typeof input !== 'object' || input === null)
		throw new VibrationInputError('oscillator input', 'an object', input);
	const m = positive('mass', input.mass);
	const k = positive('stiffness', input.stiffness);
	const c = nonNegative('damping', input.damping ?? 0);
	const omega0 = Math.sqrt(k / m);
	return oscillatorFromModal({ omega0, dampingRatio: c / (2 * Math.sqrt(k * m)) });
}

/** Oscillator from ω₀ (rad/s) and ζ. */
export function oscillatorFromModal(input: { omega0: number; dampingRatio: number }): Oscillator {
	const w = positive('omega0', input.omega0);
	const z = nonNegative('dampingRatio', input.dampingRatio);
	const regime = regimeOf(z);
	const a = -z * w;
	let roots: [Complex, Complex];
	let dampedFrequencyHz: number | null = null;
	let qFactor: number | null = null;
	let logDecrement: number | null = null;
	if (regime === 'undamped') {
		roots = [
			{ re: 0, im: w },
			{ re: 0, im: -w }
		];
		dampedFrequencyHz = w / (2 * Math.PI);
		logDecrement = 0;
	} else if (regime === 'underdamped') {
		const wd = w * Math.sqrt(1 - z * z);
		roots = [
			{ re: a, im: wd },
			{ re: a, im: -wd }
		];
		dampedFrequencyHz = wd / (2 * Math.PI);
		qFactor = 1 / (2 * z);
		logDecrement = (2 * Math.PI * z) / Math.sqrt(1 - z * z);
	} else if (regime === 'critical') {
		roots = [
			{ re: -w, im: 0 },
			{ re: -w, im: 0 }
		];
	} else {
		const s = w * Math.sqrt(z * z - 1);
		roots = [
			{ re: a + s, im: 0 },
			{ re: a - s, im: 0 }
		];
	}
	return {
		omega0: w,
		naturalFrequencyHz: w / (2 * Math.PI),
		dampingRatio: z,
		regime,
		roots,
		dampedFrequencyHz,
		qFactor,
		logDecrement
	};
}

export function regimeOf(dampingRatio: number): Regime {
	const z = nonNegative('dampingRatio', dampingRatio);
	if (z < UNDAMPED_TOLERANCE) return 'undamped';
	if (Math.abs(z - 1) < CRITICAL_TOLERANCE) return 'critical';
	return z < 1 ? 'underdamped' : 'overdamped';
}

export interface FreeResponse {
	regime: Regime;
	/** displacement at time t (s), same unit as x0 */
	displacement(t: number): number;
	/** velocity at time t (s) */
	velocity(t: number): number;
	/** where it oscillates: x(t) = amplitude·e^(−ζω₀t)·cos(ω_d t − phase) */
	amplitude: number | null;
	/** phase in radians, in (−π, π] */
	phase: number | null;
	/** decay rate σ of the slowest-decaying part of the response, 1/s (0 when undamped) */
	decayRate: number;
	/** the time constant 1/σ, s; null when undamped */
	timeConstant: number | null;
	/** time for the envelope e^(−σt) to fall to `fraction` (0 < fraction < 1); null when undamped */
	timeToDecay(fraction: number): number | null;
}

/**
 * Closed-form free response from initial displacement x0 and velocity v0 (Rao §2.6; Inman §1.3).
 * Underdamped: x = e^(−ζω₀t)[x0 cos ω_d t + (v0 + ζω₀x0)/ω_d · sin ω_d t].
 * Critical:    x = [x0 + (v0 + ω₀x0)t] e^(−ω₀t).
 * Overdamped:  x = C1 e^(s1 t) + C2 e^(s2 t), C1 = (v0 − s2 x0)/(s1 − s2), C2 = (s1 x0 − v0)/(s1 − s2).
 */
export function freeResponse(osc: Oscillator, initial: { x0: number; v0: number }): FreeResponse {
	const x0 = finite('x0', initial.x0);
	const v0 = finite('v0', initial.v0);
	const w = osc.omega0;
	const z = osc.dampingRatio;
	const checkT = (t: number) => finite('t', t);
	let displacement: (t: number) => number;
	let velocity: (t: number) => number;
	let amplitude: number | null = null;
	let phase: number | null = null;
	let decayRate: number;

	if (osc.regime === 'undamped' || osc.regime === 'underdamped') {
		const sigma = z * w;
		const wd = w * Math.sqrt(1 - z * z);
		const b = (v0 + sigma * x0) / wd;
		amplitude = Math.hypot(x0, b);
		phase = Math.atan2(b, x0);
		decayRate = sigma;
		displacement = (t) => {
			checkT(t);
			return Math.exp(-sigma * t) * (x0 * Math.cos(wd * t) + b * Math.sin(wd * t));
		};
		velocity = (t) => {
			checkT(t);
			const e = Math.exp(-sigma * t);
			const c = Math.cos(wd * t);
			const s = Math.sin(wd * t);
			return e * (-sigma * (x0 * c + b * s) + wd * (-x0 * s + b * c));
		};
	} else if (osc.regime === 'critical') {
		const b = v0 + w * x0;
		decayRate = w;
		displacement = (t) => (x0 + b * checkT(t)) * Math.exp(-w * t);
		velocity = (t) => (b - w * (x0 + b * checkT(t))) * Math.exp(-w * t);
	} else {
		const s1 = osc.roots[0].re;
		const s2 = osc.roots[1].re;
		const c1 = (v0 - s2 * x0) / (s1 - s2);
		const c2 = (s1 * x0 - v0) / (s1 - s2);
		decayRate = -s1;
		displacement = (t) => c1 * Math.exp(s1 * checkT(t)) + c2 * Math.exp(s2 * t);
		velocity = (t) => c1 * s1 * Math.exp(s1 * checkT(t)) + c2 * s2 * Math.exp(s2 * t);
	}
	return {
		regime: osc.regime,
		displacement,
		velocity,
		amplitude,
		phase,
		decayRate,
		timeConstant: decayRate > 0 ? 1 / decayRate : null,
		timeToDecay(fraction: number) {
			const f = finite('fraction', fraction);
			if (f <= 0 || f >= 1)
				throw new VibrationInputError('fraction', 'between 0 and 1 (exclusive)', fraction);
			return decayRate > 0 ? -Math.log(f) / decayRate : null;
		}
	};
}

/**
 * √((1 − r²)² + (2ζr)²), the denominator of the forced response, with the checked inputs; zero
 * (ζ = 0 at r = 1, an unbounded response) is refused.
 */
function resonanceDenominator(frequencyRatio: number, dampingRatio: number) {
	const r = nonNegative('frequencyRatio', frequencyRatio);
	const z = nonNegative('dampingRatio', dampingRatio);
	const d = Math.hypot(1 - r * r, 2 * z * r);
	if (d === 0)
		throw new VibrationInputError(
			'frequencyRatio',
			'other than 1 when dampingRatio is 0 (the response is unbounded)',
			r
		);
	return { r, z, d };
}

/**
 * Dynamic magnification (force excitation), DMF(r) = 1/√((1 − r²)² + (2ζr)²), r = ω/ω₀ (F8).
 * Unbounded for ζ = 0 at r = 1: that input is refused rather than returning Infinity.
 */
export function magnification(frequencyRatio: number, dampingRatio: number): number {
	return 1 / resonanceDenominator(frequencyRatio, dampingRatio).d;
}

/** Phase lag of displacement behind force, φ = atan2(2ζr, 1 − r²), radians in [0, π] (F8). */
export function phaseLag(frequencyRatio: number, dampingRatio: number): number {
	const r = nonNegative('frequencyRatio', frequencyRatio);
	const z = nonNegative('dampingRatio', dampingRatio);
	return Math.atan2(2 * z * r, 1 - r * r);
}

/** Force (or base-motion) transmissibility T(r) = √((1 + (2ζr)²)/((1 − r²)² + (2ζr)²)) (F9). */
export function transmissibility(frequencyRatio: number, dampingRatio: number): number {
	const { r, z, d } = resonanceDenominator(frequencyRatio, dampingRatio);
	return Math.hypot(1, 2 * z * r) / d;
}

/** Isolation efficiency (1 − T)·100 %; negative where the mount amplifies (r < √2). */
export function isolationEfficiencyPct(frequencyRatio: number, dampingRatio: number): number {
	return (1 - transmissibility(frequencyRatio, dampingRatio)) * 100;
}

/**
 * Frequency of the peak forced displacement response, f₀√(1 − 2ζ²) (F7), in Hz; null for
 * ζ ≥ 1/√2, where the response falls monotonically from r = 0 and has no resonant peak.
 */
export function peakResponseFrequencyHz(
	naturalFrequencyHz: number,
	dampingRatio: number
): number | null {
	const f = positive('naturalFrequencyHz', naturalFrequencyHz);
	const z = nonNegative('dampingRatio', dampingRatio);
	const q = 1 - 2 * z * z;
	return q > 0 ? f * Math.sqrt(q) : null;
}

/** The peak of the magnification curve, 1/(2ζ√(1−ζ²)) (F8); null when undamped or ζ ≥ 1/√2. */
export function peakMagnification(dampingRatio: number): number | null {
	const z = nonNegative('dampingRatio', dampingRatio);
	if (z < UNDAMPED_TOLERANCE || 1 - 2 * z * z <= 0) return null;
	return 1 / (2 * z * Math.sqrt(1 - z * z));
}

/**
 * Steady-state response to F sin ωt: x(t) = X sin(ωt − φ), X = (F/k)·DMF. Amplitude in m for F in N,
 * k in N/m.
 */
export function steadyStateAmplitude(
	forceAmplitude: number,
	stiffness: number,
	frequencyRatio: number,
	dampingRatio: number
): number {
	const f = nonNegative('forceAmplitude', forceAmplitude);
	const k = positive('stiffness', stiffness);
	return (f / k) * magnification(frequencyRatio, dampingRatio);
}
