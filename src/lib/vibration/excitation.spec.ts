import { describe, expect, it } from 'vitest';
import {
	bearingDefectFrequencies,
	excitationCatalogue,
	excitationLines,
	lineBandHz,
	lineFrequencyHz,
	type ExcitationSource
} from './index.ts';

const at = (source: ExcitationSource, rpm: number) =>
	Object.fromEntries(excitationLines(source).map((l) => [l.label, lineFrequencyHz(l, rpm)]));

describe('rolling-bearing defect frequencies (Harris & Kotzalas; domain.md §4)', () => {
	it('6205-2RS multiples of running speed: BPFI 5.4152, BPFO 3.5848, FTF 0.3983, BSF 2.3567 (domain.md B1: CWRU page values [M], formula [C])', () => {
		const f = bearingDefectFrequencies(
			{ rollingElements: 9, elementDiameter: 0.3126, pitchDiameter: 1.537, contactAngleDeg: 0 },
			1
		);
		expect(f.bpfi).toBeCloseTo(5.4152, 4);
		expect(f.bpfo).toBeCloseTo(3.5848, 4);
		expect(f.ftf).toBeCloseTo(0.39828, 3);
		expect(f.bsf).toBeCloseTo(2.35672, 5);
		// the data centre's "rolling element" 4.7135 is 2×BSF
		expect(2 * f.bsf).toBeCloseTo(4.7135, 3);
	});

	// worked examples: [case, geometry (n, d, D, φ°), shaft Hz, expected Hz, decimal places]
	it.each([
		[
			'the same bearing at 1797 rpm: BPFO 107.36, BPFI 162.19, FTF 11.93, BSF 70.58 Hz (domain.md B2 [C])',
			[9, 0.3126, 1.537, 0],
			1797 / 60,
			{ bpfo: 107.36, bpfi: 162.19, ftf: 11.93, bsf: 70.58 },
			2
		],
		[
			'1800 rpm, n = 8, d = 10, D = 50, φ = 0: FTF 12, BPFO 96, BPFI 144, BSF 72 Hz (domain.md B3 [C])',
			[8, 10, 50, 0],
			30,
			{ ftf: 12, bpfo: 96, bpfi: 144, bsf: 72 },
			10
		],
		[
			'n = 12, d = 10, D = 50, φ = 40°, 25 Hz: FTF 10.585, BPFO 127.019, BPFI 172.981, BSF 61.033 Hz (domain.md B4 [C])',
			[12, 10, 50, 40],
			25,
			{ ftf: 10.585, bpfo: 127.019, bpfi: 172.981, bsf: 61.033 },
			3
		]
	] as const)('%s', (_case, [n, d, D, angle], shaftHz, expected, places) => {
		const f = bearingDefectFrequencies(
			{ rollingElements: n, elementDiameter: d, pitchDiameter: D, contactAngleDeg: angle },
			shaftHz
		);
		for (const [k, v] of Object.entries(expected))
			expect(f[k as keyof typeof expected], k).toBeCloseTo(v, places);
	});

	it('refuses impossible geometry', () => {
		const g = { rollingElements: 8, elementDiameter: 60, pitchDiameter: 50, contactAngleDeg: 0 };
		expect(() => bearingDefectFrequencies(g, 30)).toThrow(
			/elementDiameter must be smaller than the pitch diameter/
		);
		expect(() =>
			bearingDefectFrequencies({ ...g, elementDiameter: 10, rollingElements: 2.5 }, 30)
		).toThrow(/rollingElements/);
		expect(() =>
			bearingDefectFrequencies({ ...g, elementDiameter: 10, contactAngleDeg: 95 }, 30)
		).toThrow(/contactAngleDeg/);
	});
});

describe('the excitation catalogue (domain.md §5 examples [C])', () => {
	it('6 vanes at 1780 rpm: vane pass 178.0 Hz and 2× 356.0 Hz', () => {
		const f = at({ id: 'imp', kind: 'vane', count: 6 }, 1780);
		expect(f['Vane pass 1×']).toBeCloseTo(178.0, 9);
		expect(f['Vane pass 2×']).toBeCloseTo(356.0, 9);
	});

	it('23 teeth at 1780 rpm mesh at 682.33 Hz; a 23:71 pair turns the other shaft at 1780·23/71 rpm', () => {
		const f = at({ id: 'g', kind: 'gear', teeth: 23, matingTeeth: 71 }, 1780);
		expect(f['Gear mesh 1×']).toBeCloseTo(682.33, 2);
		expect(f['Gear mesh 3×']).toBeCloseTo(3 * 682.333, 2);
		expect(f['Mating shaft 1×']).toBeCloseTo((1780 * 23) / 71 / 60, 9);
		// the mesh frequency is the same counted from either gear
		expect(f['Mating shaft 1×'] * 71).toBeCloseTo(f['Gear mesh 1×'], 9);
	});

	it('a 200 mm sheave at 1780 rpm on a 2.0 m belt: belt pass 9.32 Hz and 2× 18.64 Hz', () => {
		const f = at({ id: 'b', kind: 'belt', sheaveDiameter: 0.2, beltLength: 2.0 }, 1780);
		expect(f['Belt pass 1×']).toBeCloseTo(9.32, 2);
		expect(f['Belt pass 2×']).toBeCloseTo(18.64, 2);
		expect(() =>
			excitationLines({ id: 'b', kind: 'belt', sheaveDiameter: 1, beltLength: 2 })
		).toThrow(/beltLength must be longer/);
	});

	it('twice line frequency is fixed on the mains (120 Hz on 60 Hz) and follows a drive’s output', () => {
		const mains = excitationLines({ id: 'm', kind: 'line', lineFrequencyHz: 60 });
		expect(mains[0].fixedHz).toBe(120);
		expect(lineFrequencyHz(mains[0], 900)).toBe(120);
		// 4-pole motor on a drive, direct: at 1800 rpm the drive outputs 60 Hz → 2× line 120 Hz
		const drive = excitationLines({
			id: 'd',
			kind: 'line',
			lineFrequencyHz: 60,
			drive: { poles: 4, motorRpmPerShaftRpm: 1 }
		});
		expect(lineFrequencyHz(drive[0], 1800)).toBeCloseTo(120, 9);
		expect(lineFrequencyHz(drive[0], 900)).toBeCloseTo(60, 9);
	});

	it('shaft orders include sub-harmonics and follow a speed ratio', () => {
		const f = at({ id: 's', kind: 'shaft', orders: [0.5, 1, 2, 3] }, 1800);
		expect(Object.values(f)).toEqual([15, 30, 60, 90]);
		const fan = excitationLines({ id: 'fan', kind: 'shaft', orders: [1], speedRatio: 0.25 });
		expect(lineFrequencyHz(fan[0], 1800)).toBeCloseTo(7.5, 12);
		expect(fan[0].label).toBe('1× shaft (0.25:1)');
	});

	it('bearing lines are FTF, BSF, 2×BSF, BPFO and BPFI', () => {
		const lines = excitationLines({
			id: 'de',
			kind: 'bearing',
			label: 'DE',
			rollingElements: 8,
			elementDiameter: 10,
			pitchDiameter: 50,
			contactAngleDeg: 0
		});
		expect(lines.map((l) => l.label)).toEqual([
			'DE FTF',
			'DE BSF',
			'DE 2×BSF',
			'DE BPFO',
			'DE BPFI'
		]);
		expect(lineFrequencyHz(lines[2], 1800)).toBeCloseTo(144, 10);
	});

	it('evaluates each line over a speed range', () => {
		const [vp] = excitationLines({ id: 'v', kind: 'blade', count: 8, harmonics: [1] });
		expect(lineBandHz(vp, 600, 1200)).toEqual([80, 160]);
		const [fx] = excitationLines({
			id: 'f',
			kind: 'fixed',
			frequencyHz: 29.5,
			label: 'Compressor next door'
		});
		expect(lineBandHz(fx, 600, 1200)).toEqual([29.5, 29.5]);
		expect(fx.label).toBe('Compressor next door');
		expect(() => lineBandHz(vp, 1200, 600)).toThrow(/speed range/);
	});

	it('refuses unknown kinds, missing ids and bad counts with a message naming the field', () => {
		expect(() => excitationCatalogue([{ id: 'x', kind: 'laser' } as never])).toThrow(
			/excitation kind must be one of/
		);
		expect(() => excitationLines({ id: '', kind: 'fixed', frequencyHz: 3 })).toThrow(/source id/);
		expect(() => excitationLines({ id: 'v', kind: 'vane', count: 0 })).toThrow(
			/vane count must be a whole number of at least 1/
		);
		expect(() => excitationLines({ id: 'v', kind: 'vane', count: 5, harmonics: [] })).toThrow(
			/harmonics must be a non-empty list/
		);
		expect(() => excitationLines({ id: 'v', kind: 'shaft', orders: [1], speedRatio: -1 })).toThrow(
			/speedRatio of v/
		);
		expect(() => excitationCatalogue('nope' as never)).toThrow(/sources must be a list/);
	});
});
