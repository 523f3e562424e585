/**
 * CSV recordings: a time column plus one or more channels, or channels alone with the sample rate
 * given. Header row and a units row are detected; a decimal comma is accepted where the separator
 * is not a comma. The file streams through in chunks: papaparse reads the first lines (separator,
 * header, units, quoting), and the plain numeric rows after them are split here, one line at a
 * time, straight into columns sized from the file's length, so a 50 MB file never exists as rows
 * of strings and its columns are allocated once.
 */
import Papa from 'papaparse';
import { formatHz } from '../format.ts';
import {
	MAX_CHANNELS,
	RecordingError,
	checkChannels,
	checkSampleRate,
	checkSize,
	type Channel,
	type Recording
} from './types.ts';

const TIME_NAMES = /^(t|time|time\s*\(s\)|seconds?|s|zeit|temps|tiempo|tid)$/i;

/**
 * A Float64Array filled as rows stream in: sized once from the expected row count, grown by a
 * quarter when the guess was short, and handed over without a copy when nearly full.
 */
class Column {
	data: Float64Array;
	length = 0;
	constructor(capacity: number) {
		this.data = new Float64Array(Math.max(64, capacity));
	}
	push(v: number) {
		if (this.length === this.data.length) {
			const next = new Float64Array(Math.ceil(this.data.length * 1.25) + 64);
			next.set(this.data);
			this.data = next;
		}
		this.data[this.length++] = v;
	}
	values(): Float64Array {
		return this.length >= 0.9 * this.data.length
			? this.data.subarray(0, this.length)
			: this.data.slice(0, this.length);
	}
}

const isNumberText = (s: string) => /^[+-]?(\d+([.,]\d*)?|[.,]\d+)([eE][+-]?\d+)?$/.test(s.trim());

/** Collects rows into columns, deciding header, units, time column and decimal mark on the way. */
export class CsvCollector {
	#row = 0; // 1-based row number in the file
	#names: string[] | null = null;
	#units: string[] | null = null;
	#columns: Column[] | null = null;
	#decimalComma = false;
	#width = 0;
	#expectedRows = 4096;
	constructor(readonly delimiterIsComma: () => boolean) {}

	/** How many rows the file probably holds (from its length), so columns are sized once. */
	expectRows(n: number): void {
		this.#expectedRows = Math.max(64, Math.ceil(n));
	}

	/** Whether the first numeric row has been seen (header and units are settled). */
	get started(): boolean {
		return this.#columns !== null;
	}

	rows(rows: string[][]): void {
		for (const raw of rows) {
			this.#row++;
			// a row wider than any recording is refused before its cells are looked at: one
			// million columns once meant one million growable columns
			if (raw.length > MAX_CHANNELS + 1)
				throw new RecordingError(
					`Row ${this.#row} has ${raw.length.toLocaleString('en')} columns; a recording has at most ${MAX_CHANNELS} channels and a time column.`,
					{ row: this.#row }
				);
			const cells = raw.map((c) => c.trim());
			if (cells.length === 1 && cells[0] === '') continue; // blank line
			if (this.#columns === null) {
				const numeric = cells.every(isNumberText);
				if (!numeric && this.#names === null && this.#row === 1) {
					this.#names = cells;
					continue;
				}
				if (!numeric && this.#names !== null && this.#units === null && this.#row === 2) {
					this.#units = cells.map((u) => u.replace(/^[[(]|[\])]$/g, ''));
					continue;
				}
				this.#width = this.#names?.length ?? cells.length;
				this.#columns = Array.from({ length: this.#width }, () => new Column(this.#expectedRows));
				this.#decimalComma =
					!this.delimiterIsComma() && cells.some((c) => /^\s*[+-]?\d*,\d+/.test(c));
			}
			if (cells.length !== this.#width) {
				throw new RecordingError(
					`Row ${this.#row} has ${cells.length} value${cells.length === 1 ? '' : 's'}; the file has ${this.#width} columns.`,
					{ row: this.#row }
				);
			}
			for (let c = 0; c < cells.length; c++) {
				const text = this.#decimalComma ? cells[c].replace(',', '.') : cells[c];
				const v = isNumberText(text) ? Number(text) : NaN;
				if (!Number.isFinite(v)) {
					const name = this.#names?.[c] ? ` (“${this.#names[c]}”)` : '';
					throw new RecordingError(
						`Row ${this.#row}, column ${c + 1}${name}: expected a number, found “${cells[c].slice(0, 30)}”.`,
						{ row: this.#row, column: c + 1 }
					);
				}
				this.#columns[c].push(v);
			}
		}
	}

	finish(fileName: string, sizeBytes: number, sampleRateHz: number | null): Recording {
		if (!this.#columns || this.#columns[0].length === 0)
			throw new RecordingError(`${fileName} holds no rows of numbers.`);
		const cols = this.#columns.map((c) => c.values());
		const names =
			this.#names ??
			cols.map((_, i) =>
				i === 0 && cols.length > 1 && sampleRateHz === null ? 'time' : `Channel ${i + 1}`
			);
		const units = this.#units ?? cols.map(() => '');
		const timeAt = names.findIndex(
			(n, i) => TIME_NAMES.test(n) || (units[i] ?? '').toLowerCase() === 's'
		);
		let fs = sampleRateHz;
		let first = 0;
		// an unnamed first column that rises in even steps is a time column whatever the field
		// says: read as a signal, it would be a ramp with no modes and no error
		const unnamedTime =
			timeAt < 0 && this.#names === null && cols.length > 1 && looksLikeTime(cols[0]);
		if (timeAt === 0 || unnamedTime || (timeAt < 0 && sampleRateHz === null && cols.length > 1)) {
			fs = rateFromTime(cols[0]);
			first = 1;
			if (sampleRateHz !== null && Math.abs(fs - sampleRateHz) > 0.01 * fs)
				throw new RecordingError(
					`The file's first column is time, at ${formatHz(fs)}, but the sample rate given is ${formatHz(sampleRateHz)}: clear the sample rate (the file has its own) or correct it.`,
					{ column: 1 }
				);
		} else if (timeAt > 0) {
			throw new RecordingError(
				`The time column must come first; “${names[timeAt]}” is column ${timeAt + 1}.`,
				{ column: timeAt + 1 }
			);
		}
		if (fs === null)
			throw new RecordingError('This file has no time column: give the sample rate in Hz.');
		checkSampleRate(fileName, fs);
		const channels: Channel[] = cols.slice(first).map((samples, i) => ({
			name: names[first + i] || `Channel ${i + 1}`,
			unit: units[first + i] ?? '',
			samples
		}));
		if (channels.length === 0)
			throw new RecordingError('The file has a time column but no channel of measurements.');
		checkChannels(fileName, channels.length);
		const n = channels[0].samples.length;
		if (n < 64)
			throw new RecordingError(
				`The recording has only ${n} samples; a bump test needs at least 64.`
			);
		return { format: 'csv', fileName, sizeBytes, sampleRateHz: fs, durationS: n / fs, channels };
	}
}

/**
 * The cells of one line counted by its commonest separator (, ; tab |), up to its first line
 * break; null for a quoted line, which only a full reader can count.
 */
function cellsOf(codeAt: (i: number) => number, length: number): number | null {
	const counts = new Map<number, number>([
		[0x2c, 0],
		[0x3b, 0],
		[0x09, 0],
		[0x7c, 0]
	]);
	for (let i = 0; i < length; i++) {
		const b = codeAt(i);
		if (b === 0x0a || b === 0x0d) break;
		if (b === 0x22) return null;
		const c = counts.get(b);
		if (c !== undefined) counts.set(b, c + 1);
	}
	return Math.max(...counts.values()) + 1;
}

function refuseWide(row: number, cells: number | null): void {
	if (cells !== null && cells > MAX_CHANNELS + 1)
		throw new RecordingError(
			`Row ${row} has ${cells.toLocaleString('en')} columns; a recording has at most ${MAX_CHANNELS} channels and a time column.`,
			{ row }
		);
}

/**
 * Refuses, from the bytes and before anything is decoded or split, a CSV whose first row is wider
 * than any recording. A quoted first row is left to the full reader.
 */
export function checkFirstRow(bytes: Uint8Array): void {
	refuseWide(
		1,
		cellsOf((i) => bytes[i], bytes.length)
	);
}

/** Rising in even steps (within 1 %) from the first row to the last: a time column. */
function looksLikeTime(t: Float64Array): boolean {
	if (t.length < 3) return false;
	const dt = t[1] - t[0];
	if (!(dt > 0)) return false;
	for (let i = 2; i < t.length; i++) if (Math.abs(t[i] - t[i - 1] - dt) > 0.01 * dt) return false;
	return true;
}

/** Sample rate from a time column, refusing one that is not evenly spaced. */
function rateFromTime(t: Float64Array): number {
	if (t.length < 2) throw new RecordingError('The time column needs at least two rows.');
	const dt = t[1] - t[0];
	if (!(dt > 0))
		throw new RecordingError('The time column must increase from row to row.', { column: 1 });
	for (let i = 1; i < t.length; i++) {
		const step = t[i] - t[i - 1];
		if (Math.abs(step - dt) > 0.01 * dt + 1e-12) {
			throw new RecordingError(
				`The time column is not evenly spaced at data row ${i + 1}: a step of ${step.toPrecision(4)} s where ${dt.toPrecision(4)} s is usual.`,
				{ row: i + 1, column: 1 }
			);
		}
	}
	return (t.length - 1) / (t[t.length - 1] - t[0]);
}

const DELIMITERS = [',', ';', '\t', '|'];
/** lines read through papaparse before the rest is split here */
const HEAD_LINES = 8;

/**
 * A CSV recording fed in chunks of text. The first lines go through papaparse, which settles the
 * separator and reads any header and units row (quotes included); later lines without a quote are
 * split on the separator here, and a quoted one goes through papaparse alone.
 */
class CsvStream {
	#collector: CsvCollector;
	#delimiter: string | null = null;
	#carry = '';
	#head: string[] = [];
	#read = 0;
	constructor(readonly totalChars: number) {
		this.#collector = new CsvCollector(() => this.#delimiter === ',');
	}

	push(chunk: string): void {
		const text = this.#carry + chunk;
		let from = 0;
		for (;;) {
			const nl = text.indexOf('\n', from);
			if (nl < 0) break;
			this.#line(text, from, nl);
			from = nl + 1;
		}
		this.#carry = text.slice(from);
		this.#read += chunk.length;
	}

	finish(fileName: string, sizeBytes: number, sampleRateHz: number | null): Recording {
		if (this.#carry.length) this.#line(this.#carry, 0, this.#carry.length);
		this.#carry = '';
		if (this.#delimiter === null) this.#settle();
		return this.#collector.finish(fileName, sizeBytes, sampleRateHz);
	}

	#line(text: string, from: number, to: number): void {
		const end = to > from && text.charCodeAt(to - 1) === 13 ? to - 1 : to; // CRLF
		if (this.#delimiter === null) {
			// a line far longer than a row of numbers: counted before papaparse splits it
			if (end - from > 4096)
				refuseWide(
					this.#head.length + 1,
					cellsOf((i) => text.charCodeAt(from + i), end - from)
				);
			const line = text.slice(from, end);
			this.#head.push(line);
			if (this.#head.length >= HEAD_LINES) this.#settle();
			return;
		}
		if (end === from) return; // blank line
		const line = text.slice(from, end);
		if (line.includes('"')) {
			const row = Papa.parse<string[]>(line, { delimiter: this.#delimiter });
			this.#collector.rows(row.data.filter((r) => !(r.length === 1 && r[0] === '')));
			return;
		}
		this.#collector.rows([line.split(this.#delimiter)]);
	}

	/** papaparse reads the first lines: the separator, and the header, units and first rows. */
	#settle(): void {
		const head = this.#head.join('\n');
		const parsed = Papa.parse<string[]>(head, {
			skipEmptyLines: true,
			delimitersToGuess: DELIMITERS
		});
		this.#delimiter = parsed.meta.delimiter || ',';
		// rows ≈ the file's length over a typical line's (the median: a header line is short)
		if (this.totalChars > 0 && this.#head.length > 0) {
			const lengths = this.#head.map((l) => l.length + 1).sort((a, b) => a - b);
			const typical = lengths[lengths.length >> 1];
			this.#collector.expectRows((1.02 * this.totalChars) / Math.max(1, typical) + 64);
		}
		this.#head = [];
		this.#collector.rows(parsed.data);
	}

	get fraction(): number {
		return this.totalChars > 0 ? Math.min(1, this.#read / this.totalChars) : 0;
	}
}

/**
 * Parses CSV text (server, tests) in chunks of 1 MB, so no array of its rows is ever built.
 * `onChunk` reports progress as a fraction of characters read.
 */
export function parseCsvText(
	text: string,
	fileName: string,
	sampleRateHz: number | null = null,
	onChunk: (fraction: number) => void = () => {}
): Recording {
	checkSize(fileName, text.length);
	const stream = new CsvStream(text.length);
	const step = 1 << 16;
	for (let at = 0; at < text.length; at += step) {
		stream.push(text.slice(at, at + step));
		onChunk(stream.fraction);
	}
	return stream.finish(fileName, text.length, sampleRateHz);
}

/**
 * Parses a CSV Blob (the tablet's worker) a quarter megabyte at a time, reporting progress as a
 * fraction of bytes read: the file itself is never read into memory whole.
 */
export async function parseCsvBlob(
	file: Blob & { name?: string },
	sampleRateHz: number | null,
	onProgress: (f: number) => void = () => {}
): Promise<Recording> {
	const name = file.name ?? 'recording.csv';
	checkSize(name, file.size);
	const stream = new CsvStream(file.size);
	// slice by slice: a stream of the whole Blob reads ahead of the parser, and every chunk it
	// hands over is a buffer of its own that lingers until the next collection
	const decoder = new TextDecoder();
	const step = 1 << 18;
	try {
		for (let at = 0; at < file.size; at += step) {
			const bytes = new Uint8Array(await file.slice(at, at + step).arrayBuffer());
			stream.push(decoder.decode(bytes, { stream: at + step < file.size }));
			onProgress(Math.min(1, (at + bytes.length) / file.size));
		}
	} catch (e) {
		if (e instanceof RecordingError) throw e;
		throw new RecordingError(
			`${name} could not be read: ${e instanceof Error ? e.message : String(e)}`
		);
	}
	return stream.finish(name, file.size, sampleRateHz);
}
