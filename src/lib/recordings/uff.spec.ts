import { describe, expect, it } from 'vitest';
import { frfOf, readUff, recordingFromUff, writeUff58, UffError } from './uff.ts';
import { parseRecordingBytes } from './parse.ts';
import { analyzeRecording, defaultChoice } from './analyze.ts';
import { FRF_DF, frfUff } from '../../../tests/support/frf-uff.ts';

// Files built by hand from the public description of dataset 58 (the field layout is named beside
// each line). Record 6: 2(I5,I10),2(1X,10A1,I10,I4); record 7: 3I10,3E13.5; records 8–11:
// I10,3I5,2(1X,20A1); record 12: the values (real single precision, even spacing: 6E13.5 a line).
const pad = (s: string) => s.padEnd(80);
const header = (ordinateType: number, n: number, dx: number, unit: string, dataType: number) => [
	pad('Motor top, horizontal'), // record 1: ID line 1 (the description)
	pad('NONE'), // record 2: ID line 2
	pad('02-DEC-26 10:15:00'), // record 3: ID line 3, date and time
	pad('NONE'), // record 4: ID line 4
	pad('NONE'), // record 5: ID line 5
	// record 6: function type 1 (time response), id 1, version 0, load case 0, response entity
	// NONE node 101 direction 1 (+X), reference entity NONE node 0 direction 0
	'    1         1    0         0 NONE             101   1 NONE               0   0',
	// record 7: ordinate type, number of values, even spacing (1), x minimum, increment, z value
	`${String(ordinateType).padStart(10)}${String(n).padStart(10)}         1  0.00000E+00${dx.toExponential(5).toUpperCase().padStart(13)}  0.00000E+00`,
	// record 8: abscissa: specific data type 17 (time), exponents 0 0 0, label, units
	'        17    0    0    0 Time                 s                   ',
	// record 9: ordinate: data type (12 acceleration, 13 force), exponents, label, units
	`${String(dataType).padStart(10)}    0    0    0 ${'Response'.padEnd(20)} ${unit.padEnd(20)}`,
	// record 10: ordinate denominator: none
	'         0    0    0    0 NONE                 NONE                ',
	// record 11: z axis: none
	'         0    0    0    0 NONE                 NONE                '
];

const FS = 1024;
const sampled = (n: number) =>
	Array.from(
		{ length: n },
		(_, i) => Math.exp((-2 * i) / FS) * Math.sin((2 * Math.PI * 37.5 * i) / FS)
	);

function ascii58(values: number[], unit = 'g', dataType = 12, eol = '\n', exponent = 'E') {
	const rows: string[] = [];
	for (let i = 0; i < values.length; i += 6)
		rows.push(
			values
				.slice(i, i + 6)
				.map((v) => v.toExponential(5).toUpperCase().replace('E', exponent).padStart(13))
				.join('')
		);
	return (
		[
			'    -1',
			'    58',
			...header(2, values.length, 1 / FS, unit, dataType),
			...rows,
			'    -1'
		].join(eol) + eol
	);
}

const bytes = (s: string) => new TextEncoder().encode(s);

describe('UFF dataset 58 (ASCII)', () => {
	it('reads a time record to the same samples, sample rate and unit', () => {
		const v = sampled(300);
		const [d] = readUff(bytes(ascii58(v)));
		expect(d).toMatchObject({
			binary: false,
			functionType: 1,
			responseNode: 101,
			responseDirection: 1,
			ordinateType: 2,
			count: 300,
			even: true,
			abscissa: { dataType: 17, label: 'Time', unit: 's' },
			ordinate: { dataType: 12, unit: 'g' }
		});
		expect(d.dx).toBeCloseTo(1 / FS, 9);
		// six significant digits, as E13.5 holds them
		v.forEach((x, i) => expect(d.re[i]).toBeCloseTo(x, 5));
		const r = recordingFromUff([d], 'hit.uff', 1);
		expect(r.sampleRateHz).toBeCloseTo(FS, 3);
		expect(r.channels[0]).toMatchObject({ name: 'Motor top, horizontal', unit: 'g' });
	});

	it('is tolerant: CRLF, blank lines, Fortran D exponents, other datasets around it', () => {
		const v = sampled(64);
		const units164 = ['    -1', '   164', '         1  SI', '    1.0 1.0 1.0', '    -1'].join(
			'\r\n'
		);
		const text =
			'\r\n' +
			units164 +
			'\r\n\r\n' +
			ascii58(v, 'g', 12, '\r\n', 'D').replace(
				/( {2}-?\d\.\d{5}D[+-]\d{2}){6}\r\n/,
				(m) => m + '\r\n'
			);
		const [d] = readUff(bytes(text));
		expect(d.count).toBe(64);
		v.forEach((x, i) => expect(d.re[i]).toBeCloseTo(x, 5));
	});

	it('reads numbers that run together in full-width fields', () => {
		const lines = ascii58([-1.5, -2.25, 3, -4]).split('\n');
		lines[13] = '-1.50000E+00-2.25000E+00 3.00000E+00-4.00000E+00';
		const [d] = readUff(bytes(lines.join('\n')));
		expect([...d.re]).toEqual([-1.5, -2.25, 3, -4]);
	});

	it('says where a file is wrong', () => {
		const short = ascii58(sampled(12)).replace(/\n[^\n]*\n {4}-1\n$/, '\n    -1\n');
		expect(() => readUff(bytes(short))).toThrow(
			/UFF line \d+: the data ends after 6 of 12 numbers/
		);
		const word = ascii58(sampled(6)).replace(/\n {4}-1\n$/, '\n oops\n    -1\n');
		expect(() => readUff(bytes(word))).toThrow(/UFF line 15: “oops” is not a number/);
		const type = ascii58(sampled(6)).replace('         2         6', '         3         6');
		expect(() => readUff(bytes(type))).toThrow(/UFF line 9: ordinate type 3/);
		expect(() => readUff(bytes('    -1\n   151\n x\n    -1\n'))).toThrow(/holds no dataset 58/);
		expect(() => readUff(bytes('hello'))).toThrow(UffError);
	});
});

describe('UFF dataset 58b (binary)', () => {
	// 58b: the ID line names byte order (1 little endian, 2 big endian), floating-point format
	// (2 IEEE 754), 11 ASCII lines and the number of binary bytes, which follow the 11th line
	// directly and are followed by "-1".
	function binary58(values: number[], little: boolean, double: boolean) {
		const size = double ? 8 : 4;
		const buf = new DataView(new ArrayBuffer(values.length * size));
		values.forEach((v, i) =>
			double ? buf.setFloat64(i * 8, v, little) : buf.setFloat32(i * 4, v, little)
		);
		const ascii =
			[
				'    -1',
				`   58b     ${little ? 1 : 2}     2          11${String(values.length * size).padStart(12)}     0     0           0           0`,
				...header(double ? 4 : 2, values.length, 1 / FS, 'm/s^2', 12)
			].join('\n') + '\n';
		const head = bytes(ascii);
		const tail = bytes('\n    -1\n');
		const out = new Uint8Array(head.length + buf.byteLength + tail.length);
		out.set(head);
		out.set(new Uint8Array(buf.buffer), head.length);
		out.set(tail, head.length + buf.byteLength);
		return out;
	}

	it.each([
		['little endian, double', true, true],
		['big endian, single', false, false]
	])('reads %s', (_, little, double) => {
		const v = sampled(257);
		const [d] = readUff(binary58(v, little, double));
		expect(d).toMatchObject({ binary: true, count: 257, ordinate: { unit: 'm/s^2' } });
		v.forEach((x, i) => expect(d.re[i]).toBeCloseTo(x, double ? 12 : 6));
	});

	it('refuses a byte count that does not match the values', () => {
		const f = binary58(sampled(10), true, false);
		const text = new TextDecoder('latin1').decode(f).replace('          40', '          44');
		expect(() => readUff(Uint8Array.from(text, (c) => c.charCodeAt(0)))).toThrow(
			/58b announces 44 bytes; 10 values of 4 bytes are 40/
		);
	});
});

describe('UFF export and round trip', () => {
	it('writes time records that read back to the same samples, and into the bump-test analysis', () => {
		// a ringing mode at 37.5 Hz, ζ = 2/(2π·37.5) ≈ 0.0085, the way a bump test rings
		const v = sampled(4096);
		const text = writeUff58(
			[
				{
					name: 'KRW-RWP-104 motor top',
					unit: 'g',
					dataType: 12,
					sampleRateHz: FS,
					samples: v,
					node: 1,
					direction: 1,
					at: new Date(Date.UTC(2026, 11, 2, 10, 15))
				}
			],
			'Detune check export'
		);
		expect(text.split('\n').every((l) => l.length <= 80)).toBe(true);
		const r = parseRecordingBytes(bytes(text), 'export.uff', 'application/octet-stream', null);
		expect(r.format).toBe('uff');
		expect(r.sampleRateHz).toBeCloseTo(FS, 6);
		expect(r.channels[0]).toMatchObject({ name: 'KRW-RWP-104 motor top', unit: 'g' });
		v.forEach((x, i) => expect(r.channels[0].samples[i]).toBeCloseTo(x, 11));
		const a = analyzeRecording(r, defaultChoice(r));
		const modes = a.kind === 'ringdown' ? a.result.modes : a.result.modes;
		expect(modes.some((m) => Math.abs(m.frequencyHz - 37.5) < 0.2)).toBe(true);
	});

	it('refuses an FRF of magnitudes only, which has no phase to transform back', () => {
		const frf = ascii58(sampled(12))
			.replace('    1         1    0         0', '    4         1    0         0')
			.replace(
				'        17    0    0    0 Time                 s',
				'        18    0    0    0 Frequency            Hz'
			);
		expect(() => parseRecordingBytes(bytes(frf), 'frf.unv', '', null)).toThrow(
			'frf.unv: the FRF holds magnitudes only (no phase); export it complex (real and imaginary) to analyse it.'
		);
	});
});

const DF = FRF_DF;

describe('UFF dataset 58 FRFs', () => {
	it('transforms an FRF back to the impulse response the handbook gives', () => {
		// h(t) = e^(−ζωn t) sin(ωd t) / (m ωd), ωd = ωn √(1 − ζ²): the unit-impulse response
		const mode = { fn: 37.5, zeta: 0.02, m: 1 };
		const r = parseRecordingBytes(bytes(frfUff([mode], 'receptance')), 'frf.uff', '', null);
		expect(r.sampleRateHz).toBe(1024); // 4096 points × 0.25 Hz
		expect(r.channels).toHaveLength(1);
		expect(r.channels[0].unit).toBe('m');
		expect(r.note).toContain('impulse responses');
		const wn = 2 * Math.PI * mode.fn;
		const wd = wn * Math.sqrt(1 - mode.zeta ** 2);
		const peak = 1 / (mode.m * wd);
		for (let i = 1; i < 1024; i += 7) {
			const t = i / r.sampleRateHz;
			const h = (Math.exp(-mode.zeta * wn * t) * Math.sin(wd * t)) / (mode.m * wd);
			expect(Math.abs(r.channels[0].samples[i] - h)).toBeLessThan(0.01 * peak);
		}
	});

	it('finds two modes of an accelerance FRF in the bump-test analysis', () => {
		const modes = [
			{ fn: 37.5, zeta: 0.02, m: 1 },
			// equal modal masses; the second mode decays twice as fast
			{ fn: 52, zeta: 0.03, m: 1 }
		];
		const r = parseRecordingBytes(bytes(frfUff(modes, 'accelerance')), 'frf.unv', '', null);
		const a = analyzeRecording(r, defaultChoice(r));
		expect(a.kind).toBe('ringdown');
		const found = a.kind === 'ringdown' ? a.result.modes : [];
		for (const m of modes) {
			const f = found.find((x) => Math.abs(x.frequencyHz - m.fn) < 0.005 * m.fn);
			expect(f, `${m.fn} Hz among ${found.map((x) => x.frequencyHz.toFixed(2))}`).toBeTruthy();
			expect(f!.dampingRatio).not.toBeNull();
			expect(Math.abs(f!.dampingRatio! - m.zeta) / m.zeta).toBeLessThan(0.2);
		}
	});

	it('writes FRFs back as complex dataset 58 that reads to the same values and modes', () => {
		const file = frfUff([{ fn: 37.5, zeta: 0.02, m: 1 }], 'accelerance');
		const [d] = readUff(bytes(file));
		const text = writeUff58([], 'Detune check export', [
			frfOf(d, 'KRW-RWP-102 housing', new Date(Date.UTC(2026, 11, 2, 10, 15)))
		]);
		expect(text.split('\n').every((l) => l.length <= 80)).toBe(true);
		const [back] = readUff(bytes(text));
		expect(back).toMatchObject({
			functionType: 4,
			ordinateType: 6,
			count: d.count,
			even: true,
			responseNode: 101,
			responseDirection: 3,
			referenceNode: 1,
			referenceDirection: 3
		});
		expect(back.abscissa).toMatchObject({ dataType: 18, unit: 'Hz' });
		expect(back.ordinate).toMatchObject({ dataType: 12, unit: 'm/s^2' });
		expect(back.denominator).toMatchObject({ dataType: 13, unit: 'N' });
		expect(back.dx).toBeCloseTo(DF, 9);
		for (let q = 0; q < d.count; q += 13) {
			expect(back.re[q]).toBeCloseTo(d.re[q], 9);
			expect(back.im![q]).toBeCloseTo(d.im![q], 9);
		}
		const r = parseRecordingBytes(bytes(text), 'back.uff', '', null);
		const a = analyzeRecording(r, defaultChoice(r));
		const modes = a.kind === 'ringdown' ? a.result.modes : [];
		expect(modes.some((m) => Math.abs(m.frequencyHz - 37.5) < 0.005 * 37.5)).toBe(true);
	});

	it('refuses FRFs of different spacing in one file, and names the problem', () => {
		const a = frfUff([{ fn: 37.5, zeta: 0.02, m: 1 }], 'accelerance');
		const b = a.replace(
			`${DF.toExponential(5).toUpperCase().padStart(13)}`,
			`${(0.5).toExponential(5).toUpperCase().padStart(13)}`
		);
		expect(() => parseRecordingBytes(bytes(`${a}\n${b}`), 'two.uff', '', null)).toThrow(
			'two.uff: the FRFs differ in frequency spacing or range; export them with one setting.'
		);
	});
});
