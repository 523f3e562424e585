import { describe, expect, it } from 'vitest';
import { WaveFile } from 'wavefile';
import { parseCsvText } from './csv.ts';
import { parseWav } from './wav.ts';
import { RecordingError } from './types.ts';
import { formatOf, parseRecordingBytes, preflight } from './parse.ts';

const sine = (n: number, fs: number, f: number, a = 0.5) =>
	Array.from({ length: n }, (_, i) => a * Math.exp(-i / n) * Math.sin((2 * Math.PI * f * i) / fs));

function wav(bitDepth: string, channels: number[][], fs = 2048): Uint8Array {
	const w = new WaveFile();
	const scale = bitDepth.endsWith('f') || bitDepth === '64' ? 1 : 2 ** (Number(bitDepth) - 1) - 1;
	const data = channels.map((c) => c.map((v) => (scale === 1 ? v : Math.round(v * scale))));
	w.fromScratch(channels.length, fs, bitDepth, channels.length === 1 ? data[0] : data);
	return w.toBuffer();
}

describe('WAV recordings', () => {
	it.each(['16', '24', '32', '32f', '64'])('reads %s-bit mono, scaled to full scale', (depth) => {
		const x = sine(1000, 2048, 40);
		const r = parseWav(wav(depth, [x]), 'hit.wav');
		expect(r.sampleRateHz).toBe(2048);
		expect(r.channels).toHaveLength(1);
		expect(r.channels[0].samples).toHaveLength(1000);
		const tol = depth === '16' ? 1e-4 : 1e-6;
		for (const i of [10, 100, 500])
			expect(Math.abs(r.channels[0].samples[i] - x[i])).toBeLessThan(tol);
		expect(r.durationS).toBeCloseTo(1000 / 2048, 12);
	});

	it('reads several channels', () => {
		const r = parseWav(wav('16', [sine(500, 1000, 10), sine(500, 1000, 20, 0.2)], 1000), 'two.wav');
		expect(r.channels.map((c) => c.name)).toEqual(['Channel 1', 'Channel 2']);
		expect(r.channels[1].samples).toHaveLength(500);
	});

	it('says so when the file is truncated, not a WAV, or too short', () => {
		const good = wav('16', [sine(1000, 2048, 40)]);
		expect(() => parseWav(good.slice(0, 600), 'cut.wav')).toThrow(
			/cut.wav is truncated: its header promises 2000 bytes of samples but only 556 are there/
		);
		expect(() =>
			parseWav(new TextEncoder().encode('time,accel\n0,1\n'.repeat(10)), 'x.wav')
		).toThrow(/is not a WAV file/);
		expect(() => parseWav(wav('16', [sine(20, 2048, 40)]), 'tiny.wav')).toThrow(/only 20 samples/);
		expect(() => parseWav(new Uint8Array(0), 'empty.wav')).toThrow(/empty.wav is empty/);
	});
});

describe('WAV headers a file may not declare', () => {
	/** A good file with one header field overwritten (fmt chunk: channels at 22, rate at 24). */
	const patched = (offset: number, value: number, size: 2 | 4) => {
		const b = wav('16', [sine(1000, 2048, 40)]).slice();
		const v = new DataView(b.buffer, b.byteOffset, b.byteLength);
		if (size === 2) v.setUint16(offset, value, true);
		else v.setUint32(offset, value, true);
		return b;
	};

	it('refuses 0 or 17 channels and a sample rate outside 1 Hz – 1 MHz, with a message', () => {
		expect(() => parseWav(patched(22, 0, 2), 'none.wav')).toThrow(RecordingError);
		expect(() => parseWav(patched(22, 0, 2), 'none.wav')).toThrow(/channels|could not be read/);
		expect(() => parseWav(patched(24, 4_294_967_295, 4), 'huge.wav')).toThrow(
			/4294967295 Hz is outside 1 Hz – 1 MHz/
		);
		expect(() => parseWav(patched(24, 0, 4), 'zero.wav')).toThrow(RecordingError);
		const many = wav(
			'16',
			Array.from({ length: 17 }, () => sine(200, 2048, 40))
		);
		expect(() => parseWav(many, 'many.wav')).toThrow(/17 channels; a recording has 1 to 16/);
	});
});

describe('CSV recordings', () => {
	const rows = (n: number, fs: number, sep = ',', dec = '.') =>
		Array.from({ length: n }, (_, i) =>
			[(i / fs).toFixed(6), (Math.sin(i / 5) * 0.3).toFixed(5), (Math.cos(i / 7) * 2).toFixed(4)]
				.map((v) => v.replace('.', dec))
				.join(sep)
		).join('\n');

	it('refuses a time column or a given rate that means more than 1 MHz', () => {
		const fast = Array.from(
			{ length: 100 },
			(_, i) => `${(i * 1e-7).toExponential(3)},${Math.sin(i)}`
		);
		expect(() => parseCsvText(`t,a\n${fast.join('\n')}`, 'fast.csv')).toThrow(
			/outside 1 Hz – 1 MHz/
		);
		const one = Array.from({ length: 100 }, (_, i) => `${Math.sin(i)}`).join('\n');
		expect(() => parseCsvText(`a\n${one}`, 'rate.csv', 4_294_967_295)).toThrow(
			/outside 1 Hz – 1 MHz/
		);
	});

	it('reads a time column and two channels with a header and a units row', () => {
		const text = `time,accel,force\ns,g,N\n${rows(200, 1000)}`;
		const r = parseCsvText(text, 'bump.csv');
		expect(r.sampleRateHz).toBeCloseTo(1000, 6);
		expect(r.channels.map((c) => [c.name, c.unit])).toEqual([
			['accel', 'g'],
			['force', 'N']
		]);
		expect(r.channels[0].samples).toHaveLength(200);
		expect(r.channels[0].samples[5]).toBeCloseTo(Math.sin(1) * 0.3, 4);
	});

	it('reads a file of several chunks without losing or splitting a row', () => {
		const n = 120_000; // about 3 MB: three 1 MB chunks
		const text = `time,accel\n${Array.from({ length: n }, (_, i) => `${(i / 5000).toFixed(6)},${(Math.sin(i / 9) * 0.25).toFixed(6)}`).join('\n')}`;
		const fractions: number[] = [];
		const r = parseCsvText(text, 'long.csv', null, (f) => fractions.push(f));
		expect(fractions.length).toBeGreaterThan(2);
		expect(r.channels[0].samples).toHaveLength(n);
		expect(r.sampleRateHz).toBeCloseTo(5000, 3);
		for (const i of [0, 41_234, 87_001, n - 1])
			expect(r.channels[0].samples[i]).toBeCloseTo(Math.sin(i / 9) * 0.25, 6);
	});

	it('reads semicolons with a decimal comma', () => {
		const r = parseCsvText(
			`Zeit;Beschleunigung\n${rows(100, 500, ';', ',').replace(/;[^;\n]*$/gm, '')}`,
			'de.csv'
		);
		expect(r.sampleRateHz).toBeCloseTo(500, 6);
		expect(r.channels[0].samples[5]).toBeCloseTo(Math.sin(1) * 0.3, 4);
	});

	it('reads one channel without a header when the sample rate is given', () => {
		const text = Array.from({ length: 128 }, (_, i) => String(Math.sin(i))).join('\n');
		const r = parseCsvText(text, 'one.csv', 2560);
		expect(r.sampleRateHz).toBe(2560);
		expect(r.channels).toHaveLength(1);
		expect(() => parseCsvText(text, 'one.csv')).toThrow(
			/no time column: give the sample rate in Hz/
		);
		expect(() => parseCsvText(text, 'one.csv', 0)).toThrow(
			/a sample rate of 0 Hz is outside 1 Hz – 1 MHz/
		);
	});

	it('names the row and column of text in a number column, NaN rows and ragged rows', () => {
		const base = `time,accel\n${rows(100, 1000).replace(/,[^,\n]*$/gm, '')}`.split('\n');
		const withText = [...base];
		withText[57] = '0.056000,abc';
		expect(() => parseCsvText(withText.join('\n'), 'a.csv')).toThrow(
			'Row 58, column 2 (“accel”): expected a number, found “abc”.'
		);
		const withNaN = [...base];
		withNaN[9] = '0.008000,NaN';
		expect(() => parseCsvText(withNaN.join('\n'), 'b.csv')).toThrow(
			/Row 10, column 2 \(“accel”\): expected a number, found “NaN”/
		);
		const ragged = [...base];
		ragged[12] = '0.011000,1,2';
		try {
			parseCsvText(ragged.join('\n'), 'c.csv');
			expect.unreachable();
		} catch (e) {
			expect(e).toBeInstanceOf(RecordingError);
			expect((e as RecordingError).message).toBe('Row 13 has 3 values; the file has 2 columns.');
			expect((e as RecordingError).row).toBe(13);
		}
	});

	it('refuses an empty file, an uneven time column and a 60 MB file, each with its own message', () => {
		expect(() => parseCsvText('', 'empty.csv')).toThrow('empty.csv is empty.');
		expect(() => parseCsvText('time,accel\n', 'hdr.csv')).toThrow(
			'hdr.csv holds no rows of numbers.'
		);
		const uneven = `time,a\n${Array.from({ length: 100 }, (_, i) => `${i < 50 ? i / 1000 : i / 500},${i}`).join('\n')}`;
		expect(() => parseCsvText(uneven, 'u.csv')).toThrow(/not evenly spaced at data row 51/);
		expect(() => parseCsvText('x'.repeat(60 * 1024 * 1024), 'big.csv')).toThrow(
			'big.csv is 60.0 MB; recordings may be at most 50 MB.'
		);
	});
});

describe('one way into a recording', () => {
	it('decides the format by one rule, for the tablet and the server alike', () => {
		// the first version had two: the worker read any file not named .wav as CSV, the server
		// refused it; a .WAV sent as application/octet-stream and a .txt now read the same in both
		expect(formatOf('hit.WAV', 'application/octet-stream')).toBe('wav');
		expect(formatOf('blob', 'audio/x-wav')).toBe('wav');
		expect(formatOf('hit.txt', '')).toBe('csv');
		expect(formatOf('export', 'text/csv')).toBe('csv');
		expect(() => formatOf('photo.png', 'image/png')).toThrow(
			'photo.png is neither a CSV nor a WAV file (nor a UFF .uff / .unv).'
		);
	});
});

describe('a CSV far wider than a recording', () => {
	it('is refused at its first row with the count, before any column is built', () => {
		// the first version built a growable column per cell of the header: 1,000,000 of them
		const header = Array.from({ length: 1_000_000 }, (_, i) => `c${i}`).join(',');
		expect(() => parseCsvText(`${header}\n1,2,3`, 'wide.csv', 1000)).toThrow(
			'Row 1 has 1,000,000 columns; a recording has at most 16 channels and a time column.'
		);
		const seventeen = Array.from({ length: 17 }, (_, i) => `${i}`).join(',');
		expect(() => parseCsvText(`time,${seventeen}\n`, 'wide.csv', null)).toThrow(
			/Row 1 has 18 columns/
		);
	});

	it('is refused from its bytes before they are decoded, by the commonest separator', () => {
		const wide = new TextEncoder().encode(`${'x;'.repeat(40)}x\r\n1;2\n`);
		expect(() => preflight(wide, 'wide.csv', 'text/csv')).toThrow(/Row 1 has 41 columns/);
		expect(() => parseRecordingBytes(wide, 'wide.csv', 'text/csv', 1000)).toThrow(
			/Row 1 has 41 columns/
		);
		// a narrow first row passes; a quoted one is left to the full reader
		expect(() => preflight(new TextEncoder().encode('time,a\n0,1\n'), 'ok.csv', '')).not.toThrow();
		const quoted = new TextEncoder().encode(`"${'a,'.repeat(40)}"\n`);
		expect(() => preflight(quoted, 'q.csv', 'text/csv')).not.toThrow();
		// a WAV is not read as text
		expect(() => preflight(new Uint8Array([1, 2, 3]), 'hit.wav', 'audio/wav')).not.toThrow();
	});
});

describe('what a channel measures', () => {
	it('is read from its unit, an accelerometer when the unit says nothing', async () => {
		const { responseKindOf } = await import('./analyze.ts');
		expect(['mm/s', 'in/s', 'ips', 'm/s'].map(responseKindOf)).toEqual(Array(4).fill('velocity'));
		expect(['µm', 'um', 'mil', 'mm'].map(responseKindOf)).toEqual(Array(4).fill('displacement'));
		expect(['g', 'm/s²', 'm/s^2', '', 'V'].map(responseKindOf)).toEqual(
			Array(5).fill('acceleration')
		);
	});
});

describe('a CSV whose first column is time, with no header', () => {
	const fs = 4096;
	const text = Array.from(
		{ length: 300 },
		(_, i) => `${(i / fs).toFixed(9)},${(Math.sin(i / 5) * Math.exp(-i / 100)).toFixed(6)}`
	).join('\n');

	it('reads the column as time even with a sample rate left in the field, and says when they disagree', () => {
		// before, a sample rate given made the time column a second signal: a ramp, with no error
		expect(() => parseCsvText(text, 'hits.csv', 1000)).toThrow(
			"The file's first column is time, at 4096 Hz, but the sample rate given is 1000 Hz: clear the sample rate (the file has its own) or correct it."
		);
		const r = parseCsvText(text, 'hits.csv', 4096);
		expect(r.channels).toHaveLength(1);
		expect(r.sampleRateHz).toBeCloseTo(4096, 3);
		expect(parseCsvText(text, 'hits.csv', null).channels).toHaveLength(1);
	});

	it('prints sample rates as a person writes them', async () => {
		const { formatHz } = await import('../format.ts');
		expect(formatHz(4095.9997119648597)).toBe('4096 Hz');
		expect(formatHz(51200)).toBe('51200 Hz');
		expect(formatHz(1234.5678)).toBe('1234.57 Hz');
	});
});
