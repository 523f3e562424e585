/**
 * Vibration severity by overall velocity, in the manner of ISO 20816-3 (formerly ISO 10816-3):
 * broadband r.m.s. velocity on a bearing housing, measured over 10–1000 Hz (2–1000 Hz for
 * machines running at 120–600 r/min), placed in zone A, B, C or D by three boundary values that
 * depend on the machine group and on whether its support is rigid or flexible.
 *
 * The boundary values are data (limit sets that name their source), never constants here: users
 * must confirm them against their licensed copy of the standard and the machine maker's limits.
 */
import { VibrationInputError } from './errors.ts';
import { nextPow2, realFft } from './signal/spectrum.ts';

export const ZONES = ['A', 'B', 'C', 'D'] as const;
export type Zone = (typeof ZONES)[number];
export type Support = 'rigid' | 'flexible';

/** The three zone boundaries, mm/s r.m.s., increasing. */
export interface ZoneLimits {
	abMmS: number;
	bcMmS: number;
	cdMmS: number;
}

/**
 * The zone of an overall velocity. A value exactly on a boundary belongs to the better zone
 * (v ≤ A/B is zone A), as public implementations of the standard do.
 */
export function zoneOf(velocityMmS: number, limits: ZoneLimits): Zone {
	if (!Number.isFinite(velocityMmS) || velocityMmS < 0)
		throw new VibrationInputError('overall velocity', 'a finite value ≥ 0 mm/s', velocityMmS);
	checkLimits(limits);
	if (velocityMmS <= limits.abMmS) return 'A';
	if (velocityMmS <= limits.bcMmS) return 'B';
	if (velocityMmS <= limits.cdMmS) return 'C';
	return 'D';
}

export function checkLimits(l: ZoneLimits): void {
	for (const [name, v] of [
		['A/B', l.abMmS],
		['B/C', l.bcMmS],
		['C/D', l.cdMmS]
	] as const)
		if (!Number.isFinite(v) || v <= 0)
			throw new VibrationInputError(`zone boundary ${name}`, 'a value > 0 mm/s', v);
	if (!(l.abMmS < l.bcMmS && l.bcMmS < l.cdMmS))
		throw new VibrationInputError(
			'zone boundaries',
			'A/B < B/C < C/D',
			`${l.abMmS}, ${l.bcMmS}, ${l.cdMmS}`
		);
}

/**
 * Rigid or flexible support: rigid when the lowest natural frequency of machine and support (in
 * the measuring direction) is at least 25 % above the main excitation frequency, usually running
 * speed. With no natural frequency known the support is taken as rigid, whose limits are the
 * lower (stricter) ones, and `assumed` says so.
 */
export function supportOf(
	naturalHz: readonly number[],
	excitationHz: number
): { support: Support; assumed: boolean; lowestHz: number | null } {
	if (!Number.isFinite(excitationHz) || excitationHz <= 0)
		throw new VibrationInputError('excitation frequency', 'a value > 0 Hz', excitationHz);
	const usable = naturalHz.filter((f) => Number.isFinite(f) && f > 0);
	if (usable.length === 0) return { support: 'rigid', assumed: true, lowestHz: null };
	const lowest = Math.min(...usable);
	return {
		support: lowest >= 1.25 * excitationHz ? 'rigid' : 'flexible',
		assumed: false,
		lowestHz: lowest
	};
}

/**
 * The measurement band for a machine's running speed: 2–1000 Hz up to 600 r/min, else 10–1000 Hz.
 * `outOfScope` marks speeds outside 120–15 000 r/min, which the standard does not cover (the upper
 * figure from memory).
 */
export function severityBand(rpm: number): { lowHz: number; highHz: number; outOfScope: boolean } {
	if (!Number.isFinite(rpm) || rpm <= 0)
		throw new VibrationInputError('running speed', 'a value > 0 r/min', rpm);
	return { lowHz: rpm <= 600 ? 2 : 10, highHz: 1000, outOfScope: rpm < 120 || rpm > 15_000 };
}

/**
 * Band-limited r.m.s. of a stationary record by Parseval's theorem on its spectrum, a Hann window
 * with its power correction; `weight(f)` scales each bin's amplitude (1/(2πf) integrates
 * acceleration to velocity). Bins outside [lowHz, highHz] are left out.
 */
function bandRms(
	samples: ArrayLike<number>,
	sampleRateHz: number,
	band: { lowHz: number; highHz: number },
	weight: (f: number) => number
): number {
	const n = samples.length;
	if (n < 64) throw new VibrationInputError('record length', 'at least 64 samples', n);
	if (!Number.isFinite(sampleRateHz) || sampleRateHz <= 0)
		throw new VibrationInputError('sample rate', 'a value > 0 Hz', sampleRateHz);
	let mean = 0;
	for (let i = 0; i < n; i++) mean += samples[i];
	mean /= n;
	const windowed = new Float64Array(n);
	let power = 0;
	for (let i = 0; i < n; i++) {
		const w = 0.5 - 0.5 * Math.cos((2 * Math.PI * i) / (n - 1));
		windowed[i] = (samples[i] - mean) * w;
		power += w * w;
	}
	const nfft = nextPow2(n);
	const { re, im } = realFft(windowed, nfft);
	const df = sampleRateHz / nfft;
	let sum = 0;
	for (let k = 1; k < re.length; k++) {
		const f = k * df;
		if (f < band.lowHz || f > band.highHz) continue;
		const g = weight(f);
		// a one-sided bin carries twice its two-sided power, the Nyquist bin once
		const twice = k === re.length - 1 ? 1 : 2;
		sum += twice * (re[k] * re[k] + im[k] * im[k]) * g * g;
	}
	// Parseval with the window: mean square = Σ|X_k|² / (N · Σw²)
	return Math.sqrt(sum / (nfft * power));
}

/**
 * Overall r.m.s. velocity in mm/s from an acceleration record (m/s²), integrated in the frequency
 * domain (V = A / (2πf)) over `band`.
 */
export function velocityRmsFromAcceleration(
	accelerationMs2: ArrayLike<number>,
	sampleRateHz: number,
	band: { lowHz: number; highHz: number }
): number {
	return 1000 * bandRms(accelerationMs2, sampleRateHz, band, (f) => 1 / (2 * Math.PI * f));
}

/** Overall r.m.s. velocity in mm/s from a velocity record (m/s), band-limited the same way. */
export function velocityRmsFromVelocity(
	velocityMs: ArrayLike<number>,
	sampleRateHz: number,
	band: { lowHz: number; highHz: number }
): number {
	return 1000 * bandRms(velocityMs, sampleRateHz, band, () => 1);
}

export interface SeverityInput {
	velocityMmS: number;
	/** the running speed the zone is judged at (measured, else nominal) */
	rpm: number;
	/** the check's natural frequencies, Hz, for the rigid/flexible decision */
	naturalHz: readonly number[];
	/** the limit set's boundaries for each support, of the asset's machine group */
	limits: Record<Support, ZoneLimits>;
}

export interface SeverityResult {
	zone: Zone;
	support: Support;
	/** true when no natural frequency was known and rigid (the stricter) was taken */
	supportAssumed: boolean;
	band: { lowHz: number; highHz: number; outOfScope: boolean };
	limits: ZoneLimits;
}

export function evaluateSeverity(input: SeverityInput): SeverityResult {
	const { support, assumed } = supportOf(input.naturalHz, input.rpm / 60);
	const limits = input.limits[support];
	return {
		zone: zoneOf(input.velocityMmS, limits),
		support,
		supportAssumed: assumed,
		band: severityBand(input.rpm),
		limits
	};
}

/** Zones ranked worst first, for sorting (D before C …); no zone last. */
export const zoneRank = (z: Zone | null | undefined): number =>
	z ? 3 - ZONES.indexOf(z) : ZONES.length;
