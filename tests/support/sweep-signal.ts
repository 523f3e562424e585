/**
 * Run-ups and coast-downs as a rotor gives them, for the speed-sweep tests, end-to-end test and
 * benchmark: each mode the damped single-degree-of-freedom oscillator in standard form,
 * x″ + 2ζω₀x′ + ω₀²x = (m·e/M)(Ω² cos θ + α sin θ), driven by the unbalance m·e of a shaft whose
 * speed ramps linearly (Ω = Ω₀ + αt, θ = Ω₀t + αt²/2), integrated by ODEX (an integrator from the
 * registry, with dense output on the sample grid; independent of Detune's analysis). Modes add
 * (modal superposition). The tachometer sees a mark at θ = 0 of every turn, the rising edge a
 * straight ramp centred on θ = 0 (so its middle-level crossing is the mark itself).
 */
import { sampled } from './odex.ts';
import { noise } from './tap-signal.ts';

export interface RotorMode {
	/** natural frequency (Hz) */
	f: number;
	zeta: number;
	/** m·e/M of this mode: the displacement far above its resonance (µm) */
	unbalanceUm: number;
}

export interface SweepSpec {
	fs: number;
	/**
	 * the speed profile: (time s, rpm) knots, the speed linear between them (a run-up then a trip
	 * is three knots); the record runs from the first knot's time (0) to the last's
	 */
	speed: [number, number][];
	modes: RotorMode[];
	/** uniform noise on the vibration channel (µm, peak to peak) */
	noiseUm?: number;
	/** width of the tachometer's mark (°) */
	markDeg?: number;
	/** tachometer high level (V); a falling-edge mark (a notch) when negative */
	tachVolts?: number;
	seed?: number;
}

/** A linear ramp from `fromRpm` to `toRpm` over `seconds`. */
export function ramp(fromRpm: number, toRpm: number, seconds: number): [number, number][] {
	return [
		[0, fromRpm],
		[seconds, toRpm]
	];
}

export const durationOf = (spec: SweepSpec) => spec.speed[spec.speed.length - 1][0];

/** Shaft angle (rad), speed (rad/s) and angular acceleration (rad/s²) at time t. */
export function shaft(spec: SweepSpec, t: number): { theta: number; omega: number; alpha: number } {
	const k = spec.speed;
	let theta = 0;
	for (let i = 0; i + 1 < k.length; i++) {
		const [ta, na] = k[i];
		const [tb, nb] = k[i + 1];
		const w0 = (2 * Math.PI * na) / 60;
		const alpha = (2 * Math.PI * (nb - na)) / 60 / (tb - ta);
		if (t <= tb || i + 2 === k.length) {
			const d = t - ta;
			return { theta: theta + w0 * d + 0.5 * alpha * d * d, omega: w0 + alpha * d, alpha };
		}
		const d = tb - ta;
		theta += w0 * d + 0.5 * alpha * d * d;
	}
	throw new Error('a speed profile needs two knots');
}

/**
 * One mode's displacement (µm) on the sample grid, integrated with ODEX from the steady response
 * at the starting speed (the shaft was turning there before the ramp).
 */
export function modeDisplacement(spec: SweepSpec, m: RotorMode): Float64Array {
	const w = 2 * Math.PI * m.f;
	const rhs = (t: number, y: number[]) => {
		const { theta, omega, alpha } = shaft(spec, t);
		const force = m.unbalanceUm * (omega * omega * Math.cos(theta) + alpha * Math.sin(theta));
		return [y[1], force - 2 * m.zeta * w * y[1] - w * w * y[0]];
	};
	const start = shaft(spec, 0);
	const r = start.omega / w;
	// X = U r² / (1 − r² + 2iζr): x(0) = Re X, x′(0) = Re(iΩX)
	const d = (1 - r * r) ** 2 + (2 * m.zeta * r) ** 2;
	const xr = (m.unbalanceUm * r * r * (1 - r * r)) / d;
	const xi = (-m.unbalanceUm * r * r * 2 * m.zeta * r) / d;
	const n = Math.round(durationOf(spec) * spec.fs);
	return sampled(rhs, [xr, -start.omega * xi], spec.fs, n, (_t, y) => y[0], {
		absolute: 1e-9,
		relative: 1e-9,
		maxSteps: 1e8
	});
}

/** The tachometer channel (V): high over the mark, with a straight rising edge centred on θ = 0. */
export function tachChannel(spec: SweepSpec): Float64Array {
	const n = Math.round(durationOf(spec) * spec.fs);
	const out = new Float64Array(n);
	const mark = ((spec.markDeg ?? 40) * Math.PI) / 180;
	const volts = spec.tachVolts ?? 5;
	for (let i = 0; i < n; i++) {
		const { theta, omega } = shaft(spec, i / spec.fs);
		// the edge spans three samples' worth of angle
		const ramp = (3 * omega) / spec.fs;
		let phi = theta % (2 * Math.PI);
		if (phi > Math.PI) phi -= 2 * Math.PI;
		const rise = Math.min(1, Math.max(0, 0.5 + phi / ramp));
		const fall = Math.min(1, Math.max(0, 0.5 + (mark - phi) / ramp));
		const v = Math.min(rise, fall);
		out[i] = volts > 0 ? volts * v : -volts * (1 - v);
	}
	return out;
}

export interface SweepRecord {
	fs: number;
	tach: Float64Array;
	displacementUm: Float64Array;
}

export function sweepRecord(spec: SweepSpec): SweepRecord {
	const n = Math.round(durationOf(spec) * spec.fs);
	const x = new Float64Array(n);
	for (const m of spec.modes) {
		const d = modeDisplacement(spec, m);
		for (let i = 0; i < n; i++) x[i] += d[i];
	}
	if (spec.noiseUm) {
		const r = noise(spec.seed ?? 11);
		for (let i = 0; i < n; i++) x[i] += spec.noiseUm * r();
	}
	return { fs: spec.fs, tach: tachChannel(spec), displacementUm: x };
}

/** The record as a CSV a data collector writes: a header, a units row, then time, tachometer, vibration. */
export function sweepCsv(r: SweepRecord): string {
	const lines = ['time,Tach,Shaft displacement', 's,V,µm'];
	for (let i = 0; i < r.tach.length; i++)
		lines.push(
			`${(i / r.fs).toFixed(6)},${r.tach[i].toFixed(3)},${r.displacementUm[i].toFixed(4)}`
		);
	return lines.join('\n') + '\n';
}

/**
 * Steady unbalance response of one mode, |X| = U·r²/√((1 − r²)² + (2ζr)²) with r = Ω/ω₀ (the
 * textbook rotating-unbalance result, [S]): its peak speed and half-power speeds found numerically,
 * for a check independent of the sweep.
 */
export function steadyUnbalance(m: RotorMode) {
	const amp = (rpm: number) => {
		const r = rpm / 60 / m.f;
		return (m.unbalanceUm * r * r) / Math.sqrt((1 - r * r) ** 2 + (2 * m.zeta * r) ** 2);
	};
	const peakRpm = (60 * m.f) / Math.sqrt(1 - 2 * m.zeta * m.zeta);
	const top = amp(peakRpm);
	const solve = (lo: number, hi: number) => {
		for (let k = 0; k < 100; k++) {
			const mid = (lo + hi) / 2;
			if ((amp(mid) - Math.SQRT1_2 * top) * (amp(lo) - Math.SQRT1_2 * top) > 0) lo = mid;
			else hi = mid;
		}
		return (lo + hi) / 2;
	};
	const n1 = solve(0.5 * peakRpm, peakRpm);
	const n2 = solve(peakRpm, 2 * peakRpm);
	return { peakRpm, n1, n2, af: peakRpm / (n2 - n1) };
}

/**
 * The steady unbalance response of several modes together (each mode's complex response
 * U·r²/(1 − r² + 2iζr), summed: modal superposition): its peaks and half-power speeds found on a
 * 0.1 rpm grid between `fromRpm` and `toRpm`, for the two-mode check.
 */
export function steadyPeaks(modes: RotorMode[], fromRpm: number, toRpm: number) {
	const amp = (rpm: number) => {
		let re = 0;
		let im = 0;
		for (const m of modes) {
			const r = rpm / 60 / m.f;
			const dr = 1 - r * r;
			const di = 2 * m.zeta * r;
			const d = dr * dr + di * di;
			re += (m.unbalanceUm * r * r * dr) / d;
			im -= (m.unbalanceUm * r * r * di) / d;
		}
		return Math.hypot(re, im);
	};
	const grid: number[] = [];
	for (let n = fromRpm; n <= toRpm; n += 0.1) grid.push(n);
	const a = grid.map(amp);
	const peaks: { peakRpm: number; af: number }[] = [];
	for (let i = 1; i + 1 < a.length; i++) {
		if (!(a[i] > a[i - 1] && a[i] >= a[i + 1])) continue;
		const level = Math.SQRT1_2 * a[i];
		let l = i;
		while (l > 0 && a[l] > level) l--;
		let r = i;
		while (r < a.length - 1 && a[r] > level) r++;
		peaks.push({ peakRpm: grid[i], af: grid[i] / (grid[r] - grid[l]) });
	}
	return peaks;
}
