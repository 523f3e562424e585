import { describe, expect, it } from 'vitest';
import { analyzeSweepRecording, defaultSweepChoice, sweepChoice } from './sweep.ts';
import { parseRecordingBytes } from './parse.ts';
import { RecordingError, type Recording } from './types.ts';
import { runAnalysis } from '../server/analysis/task.ts';
import { recordingUploadQuery } from '../schemas/recording.ts';
import { ramp, sweepCsv, sweepRecord } from '../../../tests/support/sweep-signal.ts';

/** A run-up of an SDOF rotor (ODEX, tests/support/sweep-signal.ts): 50 Hz, ζ 0.05, 2100 → 3900 rpm. */
const rec = sweepRecord({
	fs: 2048,
	speed: ramp(2100, 3900, 40),
	modes: [{ f: 50, zeta: 0.05, unbalanceUm: 10 }],
	noiseUm: 1
});
const csv = new TextEncoder().encode(sweepCsv(rec));

describe('speed-sweep recordings', () => {
	it('reads a CSV with time, tachometer and vibration and guesses the roles from the names', () => {
		const r = parseRecordingBytes(csv, 'runup.csv', 'text/csv', null);
		const choice = defaultSweepChoice(r, [6], 3600);
		expect(choice).toEqual({
			response: 1,
			speed: { kind: 'tach', channel: 0, pulsesPerRev: 1, polarity: 'auto' },
			orders: [1, 2, 6],
			maxRpm: 3600
		});
		const a = analyzeSweepRecording(r, choice);
		expect(a.unit).toBe('µm');
		expect(a.tach).toMatchObject({ source: 'tach', polarity: 'rising', missing: 0, extra: 0 });
		const found = a.result.pieces[0].resonances.filter((x) => x.order === 1);
		expect(found).toHaveLength(1);
		// steady peak at 3000/√(1 − 2·0.05²) = 3007.5 rpm (textbook, [S]); the sweep moves it up a little
		expect(Math.abs(found[0].criticalRpm / 3007.5 - 1)).toBeLessThan(0.006);
	});

	it('takes the most two-level channel as the tachometer when no name says so', () => {
		const base: Recording = parseRecordingBytes(csv, 'runup.csv', 'text/csv', null);
		const r = {
			...base,
			channels: [
				{ ...base.channels[1], name: 'Channel 1' },
				{ ...base.channels[0], name: 'Channel 2' }
			]
		};
		const c = defaultSweepChoice(r);
		expect(c.speed).toMatchObject({ kind: 'tach', channel: 1 });
		expect(c.response).toBe(0);
	});

	it('says which channel is wrong when the tachometer chosen is the vibration', () => {
		const r = parseRecordingBytes(csv, 'runup.csv', 'text/csv', null);
		const wrong = sweepChoice.parse({
			response: 0,
			speed: { kind: 'tach', channel: 1, pulsesPerRev: 1 },
			orders: [1]
		});
		expect(() => analyzeSweepRecording(r, wrong)).toThrow(RecordingError);
		expect(() =>
			sweepChoice.parse({ response: 1, speed: { kind: 'rpm', channel: 1 }, orders: [1] })
		).toThrow(/different channels/);
	});

	it('refuses a one-channel file and a steady-speed record with plain messages', () => {
		const r = parseRecordingBytes(csv, 'runup.csv', 'text/csv', null);
		expect(() => defaultSweepChoice({ ...r, channels: [r.channels[1]] })).toThrow(/one channel/);
		const steady = sweepRecord({ fs: 2048, speed: ramp(3000, 3000, 5), modes: [] });
		const s = parseRecordingBytes(
			new TextEncoder().encode(sweepCsv(steady)),
			's.csv',
			'text/csv',
			null
		);
		expect(() => analyzeSweepRecording(s, defaultSweepChoice(s))).toThrow(
			/not a run-up or coast-down/
		);
	});

	it('is analysed again on the server with the roles the tablet used: its modes are the resonances', () => {
		const choice = sweepChoice.parse({
			response: 1,
			speed: { kind: 'tach', channel: 0, pulsesPerRev: 1 },
			orders: [1, 2]
		});
		const out = runAnalysis({
			bytes: csv,
			fileName: 'runup.csv',
			mediaType: 'text/csv',
			sampleRateHz: null,
			role: 'sweep',
			sweep: choice
		});
		expect(out.ok).toBe(true);
		if (!out.ok) return;
		expect(out.analysis.kind).toBe('sweep');
		expect(out.analysis.modes).toHaveLength(1);
		const m = out.analysis.modes[0];
		expect(Math.abs(m.frequencyHz / 50.125 - 1)).toBeLessThan(0.006);
		expect(m.qFactor).toBeCloseTo(1 / (2 * (m.dampingRatio ?? 0)), 9);
		expect(m.flags.slice(0, 2)).toEqual(['run-up', 'order-1']);
	});

	it('takes a sweep upload only with its roles, given as JSON the schema accepts', () => {
		const id = '0b0d7f0e-7a51-4c43-9d0e-5c2b1b7d3e11';
		const base = { id, assetId: 'a1', name: 'runup.csv' };
		const roles = JSON.stringify({
			response: 1,
			speed: { kind: 'tach', channel: 0, pulsesPerRev: 1 },
			orders: [1]
		});
		const ok = recordingUploadQuery.safeParse({ ...base, role: 'sweep', sweep: roles });
		expect(ok.success).toBe(true);
		expect(ok.data?.sweep?.speed).toEqual({
			kind: 'tach',
			channel: 0,
			pulsesPerRev: 1,
			polarity: 'auto'
		});
		expect(recordingUploadQuery.safeParse({ ...base, role: 'sweep' }).success).toBe(false);
		expect(recordingUploadQuery.safeParse({ ...base, sweep: roles }).success).toBe(false);
		expect(recordingUploadQuery.safeParse({ ...base, role: 'sweep', sweep: '{bad' }).success).toBe(
			false
		);
		expect(
			recordingUploadQuery.safeParse({
				...base,
				role: 'sweep',
				sweep: JSON.stringify({ response: 1, orders: [] })
			}).success
		).toBe(false);
	});
});
