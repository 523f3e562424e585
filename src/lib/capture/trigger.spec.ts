import { describe, expect, it } from 'vitest';
import { HitCatcher, TRIGGER_DEFAULTS, type CaughtHit, type TriggerSettings } from './trigger.ts';
import { noise } from '../../../tests/support/tap-signal.ts';

// Synthetic blocks with known answers: a damped sine x = A·e^(−ζωt)·sin(ω_d t) after each strike
// (the free response of the damped oscillator in standard form), over uniform noise.
const fs = 8000;
const settings = (over: Partial<TriggerSettings> = {}): TriggerSettings => ({
	sampleRateHz: fs,
	channels: 1,
	triggerChannel: 0,
	recordSamples: fs, // 1 s
	...TRIGGER_DEFAULTS,
	...over
});

function signal(seconds: number, strikes: { at: number; amp: number }[], noiseFs = 1e-3) {
	const r = noise(3);
	const x = new Float32Array(Math.round(seconds * fs));
	const f = 120;
	const zeta = 0.02;
	const w = 2 * Math.PI * f;
	for (let i = 0; i < x.length; i++) {
		let v = noiseFs * Math.sqrt(12) * r(); // uniform noise of r.m.s. noiseFs
		for (const s of strikes) {
			const t = i / fs - s.at;
			if (t >= 0) v += s.amp * Math.exp(-zeta * w * t) * Math.sin(w * Math.sqrt(1 - zeta ** 2) * t);
		}
		x[i] = v;
	}
	return x;
}

/** the signal in blocks of 512, as the worklet hands them over */
function feed(c: HitCatcher, x: Float32Array): CaughtHit[] {
	const hits: CaughtHit[] = [];
	for (let i = 0; i < x.length; i += 512) hits.push(...c.push([x.subarray(i, i + 512)]));
	return hits;
}

describe('the hit catcher', () => {
	it('learns the noise floor, then triggers and keeps the pre-trigger samples from before the hit', () => {
		const x = signal(3, [{ at: 1.2, amp: 0.3 }]);
		const c = new HitCatcher(settings());
		const hits = feed(c, x);
		expect(hits).toHaveLength(1);
		const h = hits[0];
		expect(h.reason).toBeNull();
		// 5 % pre-trigger: the record starts 400 samples before the trigger sample
		expect(h.triggerAt).toBe(400);
		// the noise floor learnt is the noise's r.m.s. (1e-3) within the median's scatter
		expect(h.noiseFs).toBeGreaterThan(0.8e-3);
		expect(h.noiseFs).toBeLessThan(1.2e-3);
		// the record is the signal itself from 400 samples before the trigger: find the trigger
		// sample in the stream and compare sample for sample, the pre-trigger included
		const start = h.endSample - fs;
		for (let k = 0; k < fs; k += 97) expect(h.channels[0][k]).toBe(x[start + k]);
		// the trigger fired on the first sample over 10× the noise, just after the strike at 1.2 s
		expect((start + h.triggerAt) / fs).toBeGreaterThan(1.2);
		expect((start + h.triggerAt) / fs).toBeLessThan(1.2 + 0.002);
		// the pre-trigger part is noise only: nothing of the hit leaks before it
		let pre = 0;
		for (let k = 0; k < h.triggerAt; k++) pre = Math.max(pre, Math.abs(h.channels[0][k]));
		expect(pre).toBeLessThan(0.01);
	});

	it('does not take a hit under the trigger level', () => {
		// 5× the noise's r.m.s. peak: under the 10× level
		const x = signal(3, [{ at: 1.2, amp: 5e-3 }]);
		const c = new HitCatcher(settings());
		expect(feed(c, x)).toHaveLength(0);
		expect(c.state).toBe('armed');
	});

	it('rejects a double hit: a second strike while the first still rings', () => {
		const x = signal(3, [
			{ at: 1.2, amp: 0.3 },
			{ at: 1.45, amp: 0.25 }
		]);
		const hits = feed(new HitCatcher(settings()), x);
		expect(hits).toHaveLength(1);
		expect(hits[0].reason).toBe('double-hit');
	});

	it('rejects an overload: samples at full scale', () => {
		const x = signal(3, [{ at: 1.2, amp: 1.4 }]).map((v) => Math.max(-1, Math.min(1, v)));
		const hits = feed(new HitCatcher(settings()), x);
		expect(hits).toHaveLength(1);
		expect(hits[0].reason).toBe('overload');
	});

	it('takes but rejects a hit that rises over the level but not 30× over the noise', () => {
		const x = signal(3, [{ at: 1.2, amp: 0.02 }]); // 20× the noise's r.m.s.
		const hits = feed(new HitCatcher(settings()), x);
		expect(hits).toHaveLength(1);
		expect(hits[0].reason).toBe('too-weak');
	});

	it('takes three hits in turn, each after the structure settled, not the ring-down as a new hit', () => {
		const x = signal(7, [
			{ at: 1, amp: 0.3 },
			{ at: 3, amp: 0.2 },
			{ at: 5.2, amp: 0.35 }
		]);
		const hits = feed(new HitCatcher(settings()), x);
		expect(hits.map((h) => h.reason)).toEqual([null, null, null]);
		const at = hits.map((h) => (h.endSample - fs + h.triggerAt) / fs);
		[1, 3, 5.2].forEach((t, i) => expect(Math.abs(at[i] - t)).toBeLessThan(0.002));
	});

	it('triggers on the force channel of a two-channel input and keeps both channels', () => {
		const resp = signal(3, [{ at: 1.2, amp: 0.3 }]);
		const force = new Float32Array(resp.length);
		const r = noise(9);
		for (let i = 0; i < force.length; i++) {
			const t = i / fs - 1.2;
			force[i] = 1e-3 * r() + (t >= 0 && t < 0.002 ? 0.5 * Math.sin((Math.PI * t) / 0.002) : 0);
		}
		const c = new HitCatcher(settings({ channels: 2 }));
		const hits: CaughtHit[] = [];
		for (let i = 0; i < resp.length; i += 512)
			hits.push(...c.push([force.subarray(i, i + 512), resp.subarray(i, i + 512)]));
		expect(hits).toHaveLength(1);
		expect(hits[0].channels).toHaveLength(2);
		expect(hits[0].reason).toBeNull();
		expect(hits[0].peakFs[0]).toBeCloseTo(0.5, 2);
	});
});
