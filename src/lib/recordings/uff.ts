/**
 * Universal File Format, dataset 58 (function at a nodal degree of freedom) in its ASCII form and
 * its binary variant 58b: time records and FRFs as portable data collectors and modal software
 * exchange them. Written from the format's public description (records 1–11 in ASCII, then the
 * data as record 12), field by field:
 *
 *   -1                                   start of a dataset
 *   58  (or "58b x y 11 n …")            dataset number; 58b: x byte order (1 little, 2 big
 *                                        endian), y floating point (2 IEEE 754), 11 ASCII lines,
 *                                        n bytes of binary data after them
 *   record 1–5                           ID lines: description, …, date and time, …
 *   record 6  2(I5,I10),2(1X,10A1,I10,I4) function type, function id, version, load case,
 *                                        response entity, node, direction, reference entity,
 *                                        node, direction
 *   record 7  3I10,3E13.5                ordinate type (2 real, 4 real double, 5 complex,
 *                                        6 complex double), number of values, spacing (0 uneven,
 *                                        1 even), abscissa minimum, increment, z value
 *   record 8–11 I10,3I5,2(1X,20A1)       abscissa, ordinate (numerator), denominator and z axis:
 *                                        specific data type, length, force and temperature unit
 *                                        exponents, axis label, units label
 *   record 12                            the values (even: ordinates; uneven: abscissa with each)
 *   -1                                   end of the dataset
 *
 * The reader is tolerant where files in the field differ: CRLF or LF, blank lines between
 * datasets and inside the data, Fortran `D` exponents, numbers that run together, other datasets
 * (units, nodes) skipped. Its errors name the line.
 */
import FFT from 'fft.js';
import { RecordingError, type Channel, type Recording } from './types.ts';

/** Function types of record 6 (field 1), the ones a vibration analyst meets (from the format's description). */
export const UFF_FUNCTION_TYPES: Record<number, string> = {
	0: 'general',
	1: 'time response',
	2: 'auto spectrum',
	3: 'cross spectrum',
	4: 'frequency response function',
	5: 'transmissibility',
	6: 'coherence',
	9: 'power spectral density',
	12: 'spectrum'
};

/** Specific data types of records 8–11 (field 1), for the units a channel carries. */
export const UFF_DATA_TYPES: Record<number, string> = {
	0: 'unknown',
	1: 'general',
	8: 'displacement',
	11: 'velocity',
	12: 'acceleration',
	13: 'excitation force',
	15: 'pressure',
	17: 'time',
	18: 'frequency'
};

export interface UffAxis {
	dataType: number;
	label: string;
	unit: string;
}

export interface UffDataset {
	binary: boolean;
	/** records 1–5, trimmed */
	idLines: string[];
	functionType: number;
	functionId: number;
	responseEntity: string;
	responseNode: number;
	responseDirection: number;
	referenceEntity: string;
	referenceNode: number;
	referenceDirection: number;
	ordinateType: 2 | 4 | 5 | 6;
	count: number;
	even: boolean;
	xMin: number;
	dx: number;
	abscissa: UffAxis;
	ordinate: UffAxis;
	denominator: UffAxis;
	/** the abscissa of each value for uneven spacing; null when even */
	x: Float64Array | null;
	re: Float64Array;
	/** imaginary parts for complex ordinates, else null */
	im: Float64Array | null;
}

export class UffError extends RecordingError {}

const NUMBER = /[-+]?(?:\d+\.?\d*|\.\d+)(?:[EeDd][-+]?\d+)?/g;
const num = (s: string) => Number(s.replace(/[Dd]/, 'E'));

/** The file as lines with the byte offset after each line's end (for 58b's binary block). */
class Lines {
	readonly text: string;
	pos = 0;
	line = 0;
	constructor(readonly bytes: Uint8Array) {
		// latin1 keeps one character per byte, so offsets in the text are offsets in the bytes
		this.text = new TextDecoder('latin1').decode(bytes);
	}
	get done() {
		return this.pos >= this.text.length;
	}
	next(): string | null {
		if (this.done) return null;
		const end = this.text.indexOf('\n', this.pos);
		const stop = end < 0 ? this.text.length : end;
		const raw = this.text.slice(this.pos, stop).replace(/\r$/, '');
		this.pos = end < 0 ? this.text.length : end + 1;
		this.line++;
		return raw;
	}
}

const fail = (line: number, what: string): never => {
	throw new UffError(`UFF line ${line}: ${what}`);
};

function ints(s: string, n: number, line: number, record: string): number[] {
	const found = s.match(/[-+]?\d+/g) ?? [];
	if (found.length < n) fail(line, `${record} needs ${n} whole numbers, found ${found.length}.`);
	return found.slice(0, n).map(Number);
}

/** Record 6: fixed columns where the line is laid out so, else split on spaces. */
function record6(s: string, line: number) {
	const fixed = s.length >= 50 && /^\s*-?\d+$/.test(s.slice(0, 5));
	if (fixed) {
		const n = (a: number, b: number) => Number(s.slice(a, b).trim() || '0');
		const vals = [n(0, 5), n(5, 15), n(15, 20), n(20, 30)];
		if (vals.some((v) => !Number.isInteger(v))) return record6Split(s, line);
		return {
			functionType: vals[0],
			functionId: vals[1],
			responseEntity: s.slice(31, 41).trim(),
			responseNode: n(41, 51),
			responseDirection: n(51, 55),
			referenceEntity: s.slice(56, 66).trim(),
			referenceNode: n(66, 76),
			referenceDirection: n(76, 80)
		};
	}
	return record6Split(s, line);
}

function record6Split(s: string, line: number) {
	const t = s.trim().split(/\s+/);
	if (t.length < 4 || t.slice(0, 4).some((x) => !/^[-+]?\d+$/.test(x)))
		fail(line, 'record 6 (function type, id, version, load case, …) is not numbers.');
	// entity names may be absent (NONE) or present: take the numbers after them
	const rest = t.slice(4);
	const numbers = rest.filter((x) => /^[-+]?\d+$/.test(x)).map(Number);
	const names = rest.filter((x) => !/^[-+]?\d+$/.test(x));
	return {
		functionType: Number(t[0]),
		functionId: Number(t[1]),
		responseEntity: names[0] ?? '',
		responseNode: numbers[0] ?? 0,
		responseDirection: numbers[1] ?? 0,
		referenceEntity: names[1] ?? '',
		referenceNode: numbers[2] ?? 0,
		referenceDirection: numbers[3] ?? 0
	};
}

/** Records 8–11: the type, three exponents, then the label and units label (20 characters each). */
function axis(s: string, line: number, record: string): UffAxis {
	const [dataType] = ints(s.slice(0, 10).trim() ? s.slice(0, 10) : s, 1, line, record);
	if (s.length >= 47) {
		return {
			dataType,
			label: s.slice(26, 46).trim(),
			unit: s.slice(47, 67).trim()
		};
	}
	// short lines: the four numbers, then the label and the units separated by spaces
	const t = s.trim().split(/\s+/).slice(4);
	return {
		dataType,
		label: t.slice(0, -1).join(' ') || t[0] || '',
		unit: t.length > 1 ? t[t.length - 1] : ''
	};
}

const ORDINATE_TYPES = new Set([2, 4, 5, 6]);

/** Every dataset 58 / 58b in the file; other datasets are skipped. */
export function readUff(bytes: Uint8Array): UffDataset[] {
	const src = new Lines(bytes);
	const out: UffDataset[] = [];
	for (;;) {
		let l = src.next();
		while (l !== null && l.trim() === '') l = src.next();
		if (l === null) break;
		if (l.trim() !== '-1')
			fail(src.line, `a dataset starts with a line “-1”, not “${l.trim().slice(0, 20)}”.`);
		let id = src.next();
		while (id !== null && id.trim() === '') id = src.next();
		if (id === null) fail(src.line, 'the file ends after “-1”.');
		const head = id!.trim().split(/\s+/);
		if (head[0] === '58' || head[0] === '58b') out.push(dataset(src, head));
		else skipDataset(src);
	}
	if (out.length === 0)
		throw new UffError('This UFF file holds no dataset 58 (time records or FRFs).');
	return out;
}

function skipDataset(src: Lines) {
	for (let l = src.next(); l !== null; l = src.next()) if (l.trim() === '-1') return;
	fail(src.line, 'a dataset is not closed by “-1”.');
}

function dataset(src: Lines, head: string[]): UffDataset {
	const startLine = src.line;
	const binary = head[0] === '58b';
	let byteOrder = 1;
	let nBytes = 0;
	if (binary) {
		if (head.length < 5) fail(startLine, '58b needs byte order, format, 11 and the byte count.');
		byteOrder = Number(head[1]);
		const fp = Number(head[2]);
		nBytes = Number(head[4]);
		if (byteOrder !== 1 && byteOrder !== 2)
			fail(startLine, `58b byte order ${head[1]}: 1 (little endian) or 2 (big endian).`);
		if (fp !== 2)
			fail(startLine, `58b floating-point format ${head[2]}: only 2 (IEEE 754) is read.`);
		if (!Number.isInteger(nBytes) || nBytes <= 0)
			fail(startLine, `58b byte count “${head[4]}” is not a positive whole number.`);
	}
	const rec: string[] = [];
	for (let i = 0; i < 11; i++) {
		const l = src.next();
		if (l === null) fail(src.line, `the file ends inside the header (record ${i + 1} of 11).`);
		rec.push(l!);
	}
	const r6 = record6(rec[5], startLine + 6);
	const r7 = (rec[6].match(NUMBER) ?? []).map(num);
	if (r7.length < 5 || r7.slice(0, 3).some((v) => !Number.isInteger(v)))
		fail(startLine + 7, 'record 7 needs the ordinate type, count, spacing, minimum and increment.');
	const [ordinateType, count, spacing] = r7;
	const floats = r7.slice(3);
	if (!ORDINATE_TYPES.has(ordinateType))
		fail(startLine + 7, `ordinate type ${ordinateType}: 2, 4 (real) or 5, 6 (complex).`);
	if (count <= 0) fail(startLine + 7, `the number of values (${count}) must be positive.`);
	const even = spacing === 1;
	const xMin = floats[0] ?? 0;
	const dx = floats[1] ?? 0;
	if (even && !(dx > 0))
		fail(startLine + 7, `an even abscissa needs an increment > 0 (got ${dx}).`);
	const complex = ordinateType >= 5;
	const perValue = (complex ? 2 : 1) + (even ? 0 : 1);
	let values: Float64Array;
	if (binary)
		values = binaryBlock(src, nBytes, byteOrder, ordinateType, count * perValue, startLine);
	else values = asciiBlock(src, count * perValue);
	const re = new Float64Array(count);
	const im = complex ? new Float64Array(count) : null;
	const x = even ? null : new Float64Array(count);
	for (let i = 0, k = 0; i < count; i++) {
		if (x) x[i] = values[k++];
		re[i] = values[k++];
		if (im) im[i] = values[k++];
	}
	return {
		binary,
		idLines: rec.slice(0, 5).map((s) => s.trim()),
		...r6,
		ordinateType: ordinateType as 2 | 4 | 5 | 6,
		count,
		even,
		xMin,
		dx,
		abscissa: axis(rec[7], startLine + 8, 'record 8'),
		ordinate: axis(rec[8], startLine + 9, 'record 9'),
		denominator: axis(rec[9], startLine + 10, 'record 10'),
		x,
		re,
		im
	};
}

function asciiBlock(src: Lines, want: number): Float64Array {
	const v = new Float64Array(want);
	let n = 0;
	const start = src.line;
	for (let l = src.next(); l !== null; l = src.next()) {
		if (l.trim() === '-1') {
			if (n < want)
				fail(src.line, `the data ends after ${n} of ${want} numbers (from line ${start + 1}).`);
			return v;
		}
		for (const m of l.match(NUMBER) ?? []) {
			if (n >= want) fail(src.line, `more numbers than the ${want} record 7 announces.`);
			v[n++] = num(m);
		}
		const stray = l.replace(NUMBER, '').trim();
		if (stray) fail(src.line, `“${stray.slice(0, 16)}” is not a number.`);
	}
	return fail(src.line, 'the dataset is not closed by “-1”.');
}

function binaryBlock(
	src: Lines,
	nBytes: number,
	byteOrder: number,
	ordinateType: number,
	want: number,
	startLine: number
): Float64Array {
	const size = ordinateType === 4 || ordinateType === 6 ? 8 : 4;
	if (nBytes !== want * size)
		fail(
			startLine,
			`58b announces ${nBytes} bytes; ${want} values of ${size} bytes are ${want * size}.`
		);
	if (src.pos + nBytes > src.bytes.length) fail(src.line, 'the file ends inside the binary data.');
	const view = new DataView(src.bytes.buffer, src.bytes.byteOffset + src.pos, nBytes);
	const little = byteOrder === 1;
	const v = new Float64Array(want);
	for (let i = 0; i < want; i++)
		v[i] = size === 8 ? view.getFloat64(i * 8, little) : view.getFloat32(i * 4, little);
	src.pos += nBytes;
	// the closing "-1" follows the data, on the same line or the next
	const rest = src.next();
	const close = rest !== null && rest.trim() === '' ? src.next() : rest;
	if (close === null || close.trim() !== '-1')
		fail(src.line, '58b binary data is not followed by “-1”.');
	return v;
}

/**
 * The sample rate of an increment written in E13.5, which holds six digits: 1/1024 s reads back
 * as 9.76563E-04, i.e. 1023.9995 Hz. A rate within 10 ppm of a whole number of hertz is taken as
 * that number, as the collector was set.
 */
function rateOf(dx: number): number {
	const fs = 1 / dx;
	const whole = Math.round(fs);
	return Math.abs(fs - whole) <= 1e-5 * fs ? whole : fs;
}

const isFrf = (d: UffDataset) => d.functionType === 4;

/**
 * An FRF (function type 4, complex, on an even frequency axis from 0 or above) as its impulse
 * response: the inverse Fourier transform of H(f), h(t) = ∫ H(f) e^{i2πft} df, on fft.js. The
 * impulse response is the structure's free decay after a unit impulse, so the ring-down analysis
 * finds its modes and damping as it does for a hit. Bins below the first line are zero, and the
 * transform is padded to a power of two (zeros above the last line); fs = N·Δf.
 */
export function impulseResponseOfFrf(
	d: UffDataset,
	fileName: string
): { samples: Float64Array; sampleRateHz: number } {
	if (!d.even)
		throw new UffError(`${fileName}: an FRF with uneven frequency spacing cannot be analysed.`);
	if (!d.im)
		throw new UffError(
			`${fileName}: the FRF holds magnitudes only (no phase); export it complex (real and imaginary) to analyse it.`
		);
	const k0 = Math.round(d.xMin / d.dx);
	if (d.xMin < 0 || Math.abs(k0 * d.dx - d.xMin) > 1e-6 * d.dx)
		throw new UffError(
			`${fileName}: the FRF starts at ${d.xMin} Hz, not on a multiple of its ${d.dx} Hz spacing.`
		);
	const top = k0 + d.count - 1;
	let n = 4;
	while (n < 2 * top) n *= 2;
	const fft = new FFT(n);
	const spectrum = fft.createComplexArray() as number[];
	for (let i = 0; i < d.count; i++) {
		const k = k0 + i;
		if (k > n / 2) break;
		// one-sided H(f) and its conjugate mirror: a real impulse response
		const re = d.re[i];
		const im = k === 0 || k === n / 2 ? 0 : d.im[i];
		spectrum[2 * k] = re;
		spectrum[2 * k + 1] = im;
		if (k > 0 && k < n / 2) {
			spectrum[2 * (n - k)] = re;
			spectrum[2 * (n - k) + 1] = -im;
		}
	}
	const out = fft.createComplexArray() as number[];
	fft.inverseTransform(out, spectrum); // divides by n
	const fs = n * d.dx;
	const samples = new Float64Array(n);
	// h[m] = Δf · Σ_k H_k e^{i2πkm/n} = fs · (the inverse, which divided by n)
	for (let m = 0; m < n; m++) samples[m] = out[2 * m] * fs;
	return { samples, sampleRateHz: fs };
}

/** The FRFs of a UFF file (no time record) as impulse responses, one channel each. */
function recordingFromFrfs(frfs: UffDataset[], fileName: string, sizeBytes: number): Recording {
	const first = frfs[0];
	for (const d of frfs)
		if (
			Math.abs(d.dx - first.dx) > 1e-9 * first.dx ||
			d.count !== first.count ||
			d.xMin !== first.xMin
		)
			throw new UffError(
				`${fileName}: the FRFs differ in frequency spacing or range; export them with one setting.`
			);
	const responses = frfs.map((d) => impulseResponseOfFrf(d, fileName));
	const fs = responses[0].sampleRateHz;
	const channels: Channel[] = frfs.map((d, i) => ({
		name: `impulse response from the FRF ${
			d.idLines[0] && d.idLines[0].toUpperCase() !== 'NONE'
				? d.idLines[0]
				: `node ${d.responseNode} dir ${d.responseDirection}`
		} (${i + 1})`,
		// the numerator's unit (g, m/s, m) says what the FRF measures: accelerance, mobility, receptance
		unit: d.ordinate.unit,
		samples: responses[i].samples
	}));
	return {
		format: 'uff',
		fileName,
		sizeBytes,
		sampleRateHz: fs,
		durationS: responses[0].samples.length / fs,
		channels,
		note: `Frequency response functions, analysed as their impulse responses (the inverse transform of each FRF, ${first.dx} Hz apart up to ${(first.xMin + (first.count - 1) * first.dx).toFixed(0)} Hz).`
	};
}

/**
 * The time records of a UFF file as a recording for the bump-test analysis; a file of FRFs only
 * goes in as the FRFs' impulse responses.
 */
export function recordingFromUff(
	datasets: UffDataset[],
	fileName: string,
	sizeBytes: number
): Recording {
	const time = datasets.filter((d) => d.functionType === 1 || d.abscissa.dataType === 17);
	if (time.length === 0 && datasets.some(isFrf))
		return recordingFromFrfs(datasets.filter(isFrf), fileName, sizeBytes);
	if (time.length === 0) {
		const kinds = [
			...new Set(
				datasets.map((d) => UFF_FUNCTION_TYPES[d.functionType] ?? `type ${d.functionType}`)
			)
		];
		throw new UffError(
			`${fileName} holds ${kinds.join(', ')} but no time record or FRF; the bump-test analysis needs the time records of the hits or their frequency response functions.`
		);
	}
	const first = time[0];
	for (const d of time) {
		if (!d.even)
			throw new UffError(`${fileName}: a time record with uneven spacing cannot be analysed.`);
		if (d.im) throw new UffError(`${fileName}: a time record must be real, not complex.`);
		if (Math.abs(d.dx - first.dx) > 1e-9 * first.dx || d.count !== first.count)
			throw new UffError(
				`${fileName}: the time records differ in sample rate or length; export them with one setting.`
			);
	}
	const channels: Channel[] = time.map((d, i) => ({
		name:
			d.idLines[0] && d.idLines[0].toUpperCase() !== 'NONE'
				? d.idLines[0]
				: `node ${d.responseNode} dir ${d.responseDirection} (${i + 1})`,
		unit: d.ordinate.dataType === 13 && !d.ordinate.unit ? 'N' : d.ordinate.unit,
		samples: d.re
	}));
	return {
		format: 'uff',
		fileName,
		sizeBytes,
		sampleRateHz: rateOf(first.dx),
		durationS: first.count * first.dx,
		channels
	};
}

/** Fortran-style E fields: the value in `width` characters with `digits` after the point. */
const e = (v: number, width: number, digits: number) =>
	v
		.toExponential(digits)
		.toUpperCase()
		.replace(/E([+-])(\d)$/, 'E$10$2')
		.padStart(width);
const i = (v: number, width: number) => String(Math.trunc(v)).padStart(width);
const a = (s: string, width: number) => s.slice(0, width).padEnd(width);

export interface UffTimeRecord {
	name: string;
	unit: string;
	/** 12 acceleration, 11 velocity, 8 displacement, 13 excitation force, 0 unknown */
	dataType: number;
	sampleRateHz: number;
	samples: ArrayLike<number>;
	node: number;
	direction: number;
	/** record 3's date and time */
	at: Date;
}

const MONTHS = ['JAN', 'FEB', 'MAR', 'APR', 'MAY', 'JUN', 'JUL', 'AUG', 'SEP', 'OCT', 'NOV', 'DEC'];
const stamp = (d: Date) =>
	`${String(d.getUTCDate()).padStart(2, '0')}-${MONTHS[d.getUTCMonth()]}-${String(d.getUTCFullYear() % 100).padStart(2, '0')} ${d.toISOString().slice(11, 19)}`;

/** Time records as ASCII dataset 58 (real double precision, even spacing), one dataset each. */
/** An FRF as dataset 58 writes it: complex values on an even frequency axis. */
export interface UffFrf {
	name: string;
	/** the numerator (response) and denominator (force) data types and units, as read */
	ordinate: UffAxis;
	denominator: UffAxis;
	xMinHz: number;
	dfHz: number;
	re: ArrayLike<number>;
	im: ArrayLike<number>;
	node: number;
	direction: number;
	referenceNode: number;
	referenceDirection: number;
	at: Date;
}

/** A dataset read from a file (an FRF) as the writer takes it, under a new name and date. */
export const frfOf = (d: UffDataset, name: string, at: Date): UffFrf => {
	if (!d.im) throw new UffError(`${name}: an FRF to write must be complex.`);
	return {
		name: name.slice(0, 80),
		ordinate: d.ordinate,
		denominator: d.denominator,
		xMinHz: d.xMin,
		dfHz: d.dx,
		re: d.re,
		im: d.im,
		node: d.responseNode,
		direction: d.responseDirection,
		referenceNode: d.referenceNode,
		referenceDirection: d.referenceDirection,
		at
	};
};

const axisLine = (dataType: number, label: string, unit: string) =>
	i(dataType, 10) + i(0, 5) + i(0, 5) + i(0, 5) + ' ' + a(label, 20) + ' ' + a(unit, 20);

/** Records 1–11 of one dataset. */
function head(
	name: string,
	description: string,
	at: Date,
	functionType: number,
	id: number,
	node: number,
	direction: number,
	refNode: number,
	refDirection: number,
	ordinateType: number,
	count: number,
	xMin: number,
	dx: number,
	abscissa: string,
	ordinate: string,
	denominator: string
): string[] {
	return [
		'    -1',
		'    58',
		a(name, 80),
		a(description, 80),
		a(stamp(at), 80),
		a('Detune', 80),
		a('NONE', 80),
		i(functionType, 5) +
			i(id, 10) +
			i(0, 5) +
			i(0, 10) +
			' ' +
			a('NONE', 10) +
			i(node, 10) +
			i(direction, 4) +
			' ' +
			a('NONE', 10) +
			i(refNode, 10) +
			i(refDirection, 4),
		i(ordinateType, 10) + i(count, 10) + i(1, 10) + e(xMin, 13, 5) + e(dx, 13, 5) + e(0, 13, 5),
		abscissa,
		ordinate,
		denominator,
		axisLine(0, 'NONE', 'NONE')
	];
}

/** Values in rows of four E20.12 fields (double precision). */
function rows(values: ArrayLike<number>): string[] {
	const out: string[] = [];
	for (let j = 0; j < values.length; j += 4) {
		let row = '';
		for (let q = j; q < Math.min(j + 4, values.length); q++) row += e(values[q], 20, 12);
		out.push(row);
	}
	return out;
}

/**
 * Time records (real double precision, even spacing) and FRFs (complex double, function type 4)
 * as ASCII dataset 58, one dataset each.
 */
export function writeUff58(
	records: UffTimeRecord[],
	description: string,
	frfs: UffFrf[] = []
): string {
	const lines: string[] = [];
	records.forEach((r, k) => {
		lines.push(
			...head(
				r.name,
				description,
				r.at,
				1,
				k + 1,
				r.node,
				r.direction,
				0,
				0,
				4,
				r.samples.length,
				0,
				1 / r.sampleRateHz,
				axisLine(17, 'Time', 's'),
				axisLine(r.dataType, UFF_DATA_TYPES[r.dataType] ?? 'response', r.unit),
				axisLine(0, 'NONE', 'NONE')
			),
			...rows(r.samples),
			'    -1'
		);
	});
	frfs.forEach((f, k) => {
		const pairs = new Float64Array(2 * f.re.length);
		for (let q = 0; q < f.re.length; q++) {
			pairs[2 * q] = f.re[q];
			pairs[2 * q + 1] = f.im[q];
		}
		lines.push(
			...head(
				f.name,
				description,
				f.at,
				4,
				records.length + k + 1,
				f.node,
				f.direction,
				f.referenceNode,
				f.referenceDirection,
				6,
				f.re.length,
				f.xMinHz,
				f.dfHz,
				axisLine(18, 'Frequency', 'Hz'),
				axisLine(f.ordinate.dataType, f.ordinate.label || 'response', f.ordinate.unit),
				axisLine(f.denominator.dataType, f.denominator.label || 'force', f.denominator.unit)
			),
			...rows(pairs),
			'    -1'
		);
	});
	return lines.join('\n') + '\n';
}
