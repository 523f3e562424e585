import { describe, expect, it } from 'vitest';
import { repairPulses, revolutionsFromSpeed, revolutionsFromTach, tachEdges } from './tach.ts';
import { noise } from '../../../../tests/support/tap-signal.ts';

/**
 * A hand-built pulse train: `edges` (s) each the start of a 2 ms pulse of 5 V, at 10 kHz, with the
 * edge a straight ramp over 0.3 ms centred on the edge time (so the middle level is crossed at
 * the edge itself). Arithmetic of the checks: speed = 60 / period, by hand.
 */
function pulseTrain(edges: number[], seconds: number, fs = 10_000, volts = 5, widthS = 0.002) {
	const x = new Float64Array(Math.round(seconds * fs));
	const ramp = 0.0003;
	for (const e of edges)
		for (
			let i = Math.max(0, Math.floor((e - ramp) * fs));
			i < Math.min(x.length, (e + widthS + ramp) * fs);
			i++
		) {
			const t = i / fs;
			const rise = Math.min(1, Math.max(0, 0.5 + (t - e) / ramp));
			const fall = Math.min(1, Math.max(0, 0.5 + (e + widthS - t) / ramp));
			x[i] = Math.max(x[i], volts * Math.min(rise, fall));
		}
	return x;
}

const every = (period: number, n: number, from = 0.01) =>
	Array.from({ length: n }, (_, i) => from + i * period);

describe('tachometer pulses', () => {
	it('times each edge at its middle-level crossing and gives 60/T rpm per revolution', () => {
		// 40 ms per turn is 60 / 0.04 = 1500 rpm (by hand)
		const edges = every(0.04, 50);
		const revs = revolutionsFromTach(pulseTrain(edges, 2.05), 10_000);
		expect(revs.pulseS.length).toBe(50);
		for (let i = 0; i < 50; i++) expect(revs.pulseS[i]).toBeCloseTo(edges[i], 6);
		expect(revs.rpm.length).toBe(49);
		for (const v of revs.rpm) expect(v).toBeCloseTo(1500, 3);
		expect(revs.polarity).toBe('rising');
		expect(revs.repairs).toMatchObject({ missing: 0, extra: 0, gaps: [] });
	});

	it('repairs a missed pulse, two missed in a row and a doubled pulse, and reports each', () => {
		const edges = every(0.04, 60).filter((_, i) => i !== 10 && i !== 20 && i !== 21);
		edges.push(0.01 + 30 * 0.04 + 0.007); // a second edge 7 ms after pulse 30 (a tape edge seen twice)
		edges.sort((a, b) => a - b);
		const revs = revolutionsFromTach(pulseTrain(edges, 2.5), 10_000);
		expect(revs.repairs.missing).toBe(3);
		expect(revs.repairs.extra).toBe(1);
		expect(revs.repairs.repairedAtS.length).toBe(4);
		expect(revs.pulseS.length).toBe(60);
		for (let i = 0; i < 60; i++) expect(revs.pulseS[i]).toBeCloseTo(0.01 + i * 0.04, 6);
		for (const v of revs.rpm) expect(v).toBeCloseTo(1500, 2);
	});

	it('repairs from the neighbours on a ramp, where a global median would not', () => {
		// speed rising 300 → 3000 rpm over 6 s: angle θ = 2π(5t + 22.5t²/2) turns… by hand, turn k at
		// the root of 5t + 11.25t² = k
		const edges: number[] = [];
		for (let k = 0; ; k++) {
			const t = (-5 + Math.sqrt(25 + 45 * k)) / 22.5;
			if (t > 6) break;
			edges.push(0.01 + t);
		}
		const dropped = edges.filter((_, i) => i !== 40);
		const revs = revolutionsFromTach(pulseTrain(dropped, 6.1, 20_000), 20_000);
		expect(revs.repairs.missing).toBe(1);
		expect(revs.repairs.extra).toBe(0);
		expect(revs.pulseS.length).toBe(edges.length);
		// the put-back pulse sits midway: within 1 % of a turn of the true one at that speed
		expect(Math.abs(revs.pulseS[40] - edges[40])).toBeLessThan(0.01 * (edges[41] - edges[40]));
	});

	it('leaves a gap of many missed pulses unfilled and makes no revolution across it', () => {
		const edges = every(0.04, 60).filter((_, i) => i < 20 || i > 26);
		const revs = revolutionsFromTach(pulseTrain(edges, 2.5), 10_000);
		expect(revs.repairs.gaps).toHaveLength(1);
		expect(revs.repairs.gaps[0].fromS).toBeCloseTo(0.01 + 19 * 0.04, 5);
		expect(revs.repairs.gaps[0].toS).toBeCloseTo(0.01 + 27 * 0.04, 5);
		expect(revs.rpm.length).toBe(edges.length - 2);
		for (const v of revs.rpm) expect(v).toBeCloseTo(1500, 2);
	});

	it('finds a notch (falling edges) as well as a mark, and ignores noise on the edges (hysteresis)', () => {
		const edges = every(0.04, 50);
		const r = noise(3);
		const mark = pulseTrain(edges, 2.05);
		// a notch: high except over the pulse, with ±1 V of noise (20 % of the span)
		const notch = mark.map((v) => 5 - v + 2 * r());
		const { edgesS, polarity } = tachEdges(notch, 10_000);
		expect(polarity).toBe('falling');
		expect(edgesS.length).toBe(50);
		// noise of ±1 V on a 5 V edge 0.3 ms long moves the crossing by at most about 0.06 ms
		for (let i = 0; i < 50; i++) expect(Math.abs(edgesS[i] - edges[i])).toBeLessThan(1e-4);
	});

	it('takes edges closer than half a pulse interval at the top speed as one (the minimum interval)', () => {
		const edges = every(0.04, 50);
		// ringing: a short second pulse 0.5 ms after each edge
		const x = pulseTrain(edges, 2.05, 10_000, 5, 0.0002);
		const ring = pulseTrain(
			edges.map((e) => e + 0.0005),
			2.05,
			10_000,
			5,
			0.0002
		);
		const both = x.map((v, i) => Math.max(v, ring[i]));
		expect(tachEdges(both, 10_000).edgesS.length).toBe(100);
		const guarded = tachEdges(both, 10_000, { maxRpm: 1800 });
		expect(guarded.edgesS.length).toBe(50);
		expect(guarded.guarded).toBe(50);
	});

	it('groups several pulses per revolution into one turn', () => {
		// two marks per turn at 0° and 180°, 1200 rpm: 25 ms apart, 50 ms per turn
		const revs = revolutionsFromTach(pulseTrain(every(0.025, 81), 2.1), 10_000, {
			pulsesPerRev: 2
		});
		expect(revs.rpm.length).toBe(40);
		for (const v of revs.rpm) expect(v).toBeCloseTo(1200, 2);
	});

	it('refuses a flat channel with a clear message', () => {
		expect(() => revolutionsFromTach(new Float64Array(1000), 1000)).toThrow(/flat/);
	});

	it('gives revolutions from a speed channel in rpm by integrating it, without a phase reference', () => {
		// 1200 rpm for 2 s is 40 turns of 50 ms (by hand)
		const revs = revolutionsFromSpeed(new Float64Array(2001).fill(1200), 1000);
		expect(revs.rpm.length).toBe(40);
		for (const v of revs.rpm) expect(v).toBeCloseTo(1200, 6);
		expect(revs.endS[39]).toBeCloseTo(2, 9);
		expect(revs.phaseReference).toBe(false);
	});

	it('repairs a bare list of edges the same way', () => {
		const { pulseS, repairs } = repairPulses([0, 1, 2, 4, 5, 5.2, 6, 7]);
		expect(Array.from(pulseS)).toEqual([0, 1, 2, 3, 4, 5, 6, 7]);
		expect(repairs.missing).toBe(1);
		expect(repairs.extra).toBe(1);
	});
});
