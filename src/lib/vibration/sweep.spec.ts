import { describe, expect, it } from 'vitest';
import {
	analyzeSweep,
	MAX_SWEEP_RATE,
	resonancesOf,
	sweepPieces,
	type SweepResult
} from './sweep.ts';
import { revolutionsFromSpeed, revolutionsFromTach } from './signal/tach.ts';
import {
	ramp,
	shaft,
	steadyPeaks,
	steadyUnbalance,
	sweepRecord,
	type RotorMode,
	type SweepSpec
} from '../../../tests/support/sweep-signal.ts';

/**
 * Run-ups of an SDOF rotor with unbalance force m·e·Ω², integrated by ODEX (tests/support/
 * sweep-signal.ts). Textbook results for the steady unbalance response [S]: the displacement peaks
 * at ω_n/√(1 − 2ζ²), its phase lag passes 90° at ω_n, and the half-power AF is about 1/(2ζ) for
 * small ζ. A sweep delays the response: at a rate η = (df/dt)/Δf² the peak moves about 0.65·η
 * half-power bandwidths the way the speed goes (our ODEX runs), so the checks sweep at η ≈ 0.015.
 */
function analyse(spec: SweepSpec, orders = [1]): SweepResult {
	const rec = sweepRecord(spec);
	return analyzeSweep(rec.displacementUm, rec.fs, revolutionsFromTach(rec.tach, rec.fs), orders);
}

const FS = 4096;
const only = (r: SweepResult) => {
	const all = r.pieces.flatMap((p) => p.resonances);
	expect(all).toHaveLength(1);
	return all[0];
};
/** the tracked 1× phase lag at a speed, interpolated between revolutions */
function phaseAt(r: SweepResult, rpm: number): number {
	const t = r.pieces[0].tracks[0];
	for (let i = 1; i < t.rpm.length; i++)
		if ((t.rpm[i - 1] - rpm) * (t.rpm[i] - rpm) <= 0) {
			const f = (rpm - t.rpm[i - 1]) / (t.rpm[i] - t.rpm[i - 1]);
			return t.phaseDeg[i - 1] + f * (t.phaseDeg[i] - t.phaseDeg[i - 1]);
		}
	throw new Error(`${rpm} rpm is not in the sweep`);
}

describe('speed sweep of an SDOF rotor (ODEX)', () => {
	const cases: [number, number, number, number][] = [
		// ζ, from rpm, to rpm, seconds: each at η ≈ 0.015
		[0.02, 2700, 3300, 170],
		[0.05, 2100, 3900, 80],
		[0.1, 1500, 4800, 37]
	];
	for (const [zeta, from, to, seconds] of cases)
		it(`ζ = ${zeta}: peak at ω_n/√(1 − 2ζ²), phase 90° at ω_n, AF within 5 % of 1/(2ζ)`, () => {
			const mode: RotorMode = { f: 50, zeta, unbalanceUm: 10 };
			const r = analyse({ fs: FS, speed: ramp(from, to, seconds), modes: [mode], noiseUm: 2 });
			const res = only(r);
			const peak = (60 * mode.f) / Math.sqrt(1 - 2 * zeta * zeta);
			expect(res.direction).toBe('run-up');
			expect(Math.abs(res.criticalRpm / peak - 1)).toBeLessThan(0.0025);
			expect(res.frequencyHz).toBeCloseTo(res.criticalRpm / 60, 9);
			expect(Math.abs(phaseAt(r, 60 * mode.f) - 90)).toBeLessThan(3);
			expect(Math.abs(res.amplificationFactor * 2 * zeta - 1)).toBeLessThan(0.05);
			// and within 2 % of the steady curve's own half-power AF (found numerically)
			expect(Math.abs(res.amplificationFactor / steadyUnbalance(mode).af - 1)).toBeLessThan(0.02);
			expect(res.dampingRatio).toBeCloseTo(1 / (2 * res.amplificationFactor), 12);
			// the phase swings about 90° between the half-power speeds (45° → 135°)
			expect(res.phaseChangeDeg).toBeGreaterThan(80);
			expect(res.phaseChangeDeg).toBeLessThan(100);
			expect(res.sweepRate).toBeLessThan(MAX_SWEEP_RATE);
			expect(res.flags).toEqual([]);
		});

	it('finds the same resonance on a coast-down, and the sweep delay moves each peak its own way', () => {
		const mode: RotorMode = { f: 50, zeta: 0.05, unbalanceUm: 10 };
		// up 2100 → 3900 rpm in 30 s, then a trip: down again in 30 s (η ≈ 0.04 each way)
		const r = analyse({
			fs: FS,
			speed: [
				[0, 2100],
				[30, 3900],
				[60, 2100]
			],
			modes: [mode],
			noiseUm: 2
		});
		expect(r.pieces.map((p) => p.direction)).toEqual(['run-up', 'coast-down']);
		const [up, down] = r.pieces.map((p) => p.resonances[0]);
		const peak = (60 * mode.f) / Math.sqrt(1 - 2 * mode.zeta ** 2);
		expect(up.criticalRpm).toBeGreaterThan(peak);
		expect(down.criticalRpm).toBeLessThan(peak);
		// their mean cancels most of the delay
		expect(Math.abs((up.criticalRpm + down.criticalRpm) / 2 / peak - 1)).toBeLessThan(0.002);
		for (const x of [up, down]) {
			expect(Math.abs(x.criticalRpm / peak - 1)).toBeLessThan(0.006);
			expect(Math.abs(x.amplificationFactor * 2 * mode.zeta - 1)).toBeLessThan(0.05);
			expect(x.flags).toEqual([]);
		}
	});

	it('finds two modes of a two-mode rotor, each at its own speed with its own AF', () => {
		const modes: RotorMode[] = [
			{ f: 30, zeta: 0.03, unbalanceUm: 6 },
			{ f: 55, zeta: 0.04, unbalanceUm: 4 }
		];
		// 1200 → 4200 rpm in 300 s: η ≈ 0.05 at the lower mode
		const r = analyse({ fs: FS, speed: ramp(1200, 4200, 300), modes, noiseUm: 1 });
		const found = r.pieces[0].resonances;
		// the steady response of both modes together: each peak moved a little by the other mode
		const steady = steadyPeaks(modes, 1200, 4200);
		expect(steady).toHaveLength(2);
		expect(found).toHaveLength(2);
		found.forEach((res, i) => {
			const m = modes[i];
			expect(Math.abs(res.criticalRpm / steady[i].peakRpm - 1)).toBeLessThan(0.003);
			expect(Math.abs(res.amplificationFactor / steady[i].af - 1)).toBeLessThan(0.05);
			// and within 1.5 % of the mode's own natural frequency, AF within 10 % of 1/(2ζ)
			expect(Math.abs(res.frequencyHz / m.f - 1)).toBeLessThan(0.015);
			expect(Math.abs(res.amplificationFactor * 2 * m.zeta - 1)).toBeLessThan(0.1);
			expect(res.phaseChangeDeg).toBeGreaterThan(60);
			expect(res.flags).toEqual([]);
		});
	});

	it('flags a fast run-up, whose peak is moved up and its AF too low', () => {
		const mode: RotorMode = { f: 50, zeta: 0.02, unbalanceUm: 10 };
		// 2400 → 3600 rpm in 5 s: df/dt = 4 Hz/s over a 2 Hz bandwidth, η ≈ 0.7
		// with 2× and a 13-blade pass tracked too: the tall 1× peak's echo on them is no resonance
		const res = only(analyse({ fs: FS, speed: ramp(2400, 3600, 5), modes: [mode] }, [1, 2, 13]));
		expect(res.sweepRate).toBeGreaterThan(MAX_SWEEP_RATE);
		expect(res.flags).toContain('sweep-too-fast');
		expect(res.criticalRpm / 3000 - 1).toBeGreaterThan(0.01);
		expect(res.amplificationFactor).toBeLessThan(0.9 * 25);
	});

	it('flags an amplitude peak whose phase does not change (not a resonance)', () => {
		// a 1× whose amplitude bumps near 3000 rpm with a fixed phase (a neighbour's vibration)
		const spec: SweepSpec = { fs: FS, speed: ramp(2400, 3600, 40), modes: [] };
		const rec = sweepRecord(spec);
		const x = rec.displacementUm.map((_, i) => {
			const { theta, omega } = shaft(spec, i / FS);
			const rpm = (omega * 60) / (2 * Math.PI);
			return (5 + 40 * Math.exp(-(((rpm - 3000) / 60) ** 2))) * Math.cos(theta - 0.5);
		});
		const res = analyzeSweep(x, FS, revolutionsFromTach(rec.tach, FS), [1]).pieces[0].resonances;
		expect(res).toHaveLength(1);
		expect(res[0].criticalRpm).toBeCloseTo(3000, -1);
		expect(res[0].phaseChangeDeg).toBeLessThan(5);
		expect(res[0].flags).toContain('no-phase-change');
	});

	it('flags a peak near repaired tachometer pulses, and still finds it', () => {
		const mode: RotorMode = { f: 50, zeta: 0.05, unbalanceUm: 10 };
		const spec: SweepSpec = { fs: FS, speed: ramp(2100, 3900, 30), modes: [mode] };
		const rec = sweepRecord(spec);
		// blank the first pulse after t = 15 s (3000 rpm): the tachometer missed it
		const tach = Float64Array.from(rec.tach);
		let i = Math.round(15 * FS);
		while (tach[i] > 0) i++;
		while (tach[i] === 0) i++;
		while (tach[i] > 0) tach[i++] = 0;
		const revs = revolutionsFromTach(tach, FS);
		expect(revs.repairs.missing).toBe(1);
		const res = analyzeSweep(rec.displacementUm, FS, revs, [1]).pieces[0].resonances;
		expect(res).toHaveLength(1);
		expect(res[0].flags).toContain('tach-repair');
		expect(Math.abs(res[0].criticalRpm / 3007.5 - 1)).toBeLessThan(0.006);
	});

	it('finds the resonance from a speed channel in rpm, flagged as having no phase reference', () => {
		const mode: RotorMode = { f: 50, zeta: 0.05, unbalanceUm: 10 };
		const spec: SweepSpec = { fs: FS, speed: ramp(2100, 3900, 30), modes: [mode] };
		const rec = sweepRecord(spec);
		const rpm = rec.tach.map((_, i) => (shaft(spec, i / FS).omega * 60) / (2 * Math.PI));
		const res = analyzeSweep(rec.displacementUm, FS, revolutionsFromSpeed(rpm, FS), [1]);
		const found = res.pieces[0].resonances;
		expect(found).toHaveLength(1);
		expect(found[0].flags).toEqual(['no-phase-reference']);
		expect(Math.abs(found[0].amplificationFactor / 10 - 1)).toBeLessThan(0.05);
	});

	it('tracks 2× apart from 1×: a 2× resonance is found at half its natural frequency in rpm', () => {
		// a mode at 100 Hz driven by 2× (a misalignment-like forcing): its resonance at 3000 rpm on 2×
		const spec: SweepSpec = { fs: FS, speed: ramp(2100, 3900, 30), modes: [] };
		const rec = sweepRecord(spec);
		const x = rec.displacementUm.map((_, i) => {
			const { theta, omega } = shaft(spec, i / FS);
			const r = (2 * omega) / (2 * Math.PI * 100);
			const z = 0.05;
			const amp = 10 / Math.sqrt((1 - r * r) ** 2 + (2 * z * r) ** 2);
			return 20 * Math.cos(theta) + amp * Math.cos(2 * theta - Math.atan2(2 * z * r, 1 - r * r));
		});
		const res = analyzeSweep(x, FS, revolutionsFromTach(rec.tach, FS), [1, 2]).pieces[0];
		const twice = res.resonances.filter((q) => q.order === 2);
		expect(res.resonances.filter((q) => q.order === 1)).toEqual([]);
		expect(twice).toHaveLength(1);
		expect(Math.abs(twice[0].frequencyHz / 100 - 1)).toBeLessThan(0.005);
		expect(Math.abs(twice[0].criticalRpm / 3000 - 1)).toBeLessThan(0.005);
	});

	it('puts a waterfall row’s tallest line at the 1× frequency of its speed', () => {
		const mode: RotorMode = { f: 50, zeta: 0.05, unbalanceUm: 10 };
		const w = analyse({ fs: FS, speed: ramp(2100, 3900, 30), modes: [mode], noiseUm: 2 }).waterfall;
		const cols = w.frequencyHz.length;
		expect(w.amplitude.length).toBe(w.rpm.length * cols);
		expect(w.rpm.length).toBeGreaterThan(50);
		for (const row of [5, 25, 50]) {
			let best = 0;
			for (let c = 1; c < cols; c++)
				if (w.amplitude[row * cols + c] > w.amplitude[row * cols + best]) best = c;
			const step = w.frequencyHz[1] - w.frequencyHz[0];
			expect(Math.abs(w.frequencyHz[best] - w.rpm[row] / 60)).toBeLessThanOrEqual(
				step + w.resolutionHz
			);
		}
	});
});

describe('resonance arithmetic', () => {
	it('gives the API 684 worked case: N_c 3000, N₁ 2900, N₂ 3150 rpm → AF 12.0 (domain.md §1.2, [C])', () => {
		// a Bode curve through those points: 1 at 3000 rpm, 0.707 at 2900 and 3150, one point per rpm
		const rpm = Float64Array.from({ length: 801 }, (_, i) => 2600 + i);
		const amplitude = rpm.map((n) =>
			n <= 3000
				? Math.max(0.1, 1 - ((3000 - n) / 100) * (1 - Math.SQRT1_2))
				: Math.max(0.1, 1 - ((n - 3000) / 150) * (1 - Math.SQRT1_2))
		);
		const phaseDeg = rpm.map((n) => Math.min(170, Math.max(10, 90 + (n - 3000) * 0.45)));
		const track = { order: 1, rpm, amplitude, phaseDeg, timeS: rpm.map((_, i) => i * 0.1) };
		const revs = {
			phaseReference: true,
			repairs: { missing: 0, extra: 0, guarded: 0, repairedAtS: [], gaps: [] }
		};
		const [res] = resonancesOf(track, { fromRev: 0, toRev: 800, direction: 'run-up' }, revs);
		expect(res.n1Rpm).toBeCloseTo(2900, 1);
		expect(res.n2Rpm).toBeCloseTo(3150, 1);
		expect(res.criticalRpm).toBeCloseTo(3000, 0);
		expect(res.amplificationFactor).toBeCloseTo(12.0, 2);
	});

	it('cuts a run-up, a dwell and a coast-down into two sweeps', () => {
		const rpm = [
			...Array.from({ length: 100 }, (_, i) => 600 + 24 * i),
			...Array.from({ length: 50 }, () => 3000),
			...Array.from({ length: 100 }, (_, i) => 3000 - 24 * i)
		];
		const pieces = sweepPieces(rpm);
		expect(pieces.map((p) => p.direction)).toEqual(['run-up', 'coast-down']);
		expect(pieces[0].fromRev).toBeLessThan(5);
		expect(pieces[1].toRev).toBeGreaterThan(244);
		expect(sweepPieces(Array.from({ length: 100 }, () => 1500))).toEqual([]);
	});
});
