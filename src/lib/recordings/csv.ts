/**
 * CSV recordings: a time column plus one or more channels, or channels alone with the sample rate
 * given. Header row and a units row are detected; a decimal comma is accepted where the separator
 * is not a comma. Rows arrive in chunks (papaparse streaming), so a 50 MB file never sits in
 * memory as strings all at once.
 */
import Papa from 'papaparse';
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

/** Growable Float64Array, so channels stay compact while rows stream in. */
class Column {
	data = new Float64Array(4096);
	length = 0;
	push(v: number) {
		if (this.length === this.data.length) {
			const next = new Float64Array(this.data.length * 2);
			next.set(this.data);
			this.data = next;
		}
		this.data[this.length++] = v;
	}
	values(): Float64Array {
		return this.data.slice(0, this.length);
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
	constructor(readonly delimiterIsComma: () => boolean) {}

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
				this.#columns = Array.from({ length: this.#width }, () => new Column());
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
		if (timeAt === 0 || (timeAt < 0 && sampleRateHz === null && cols.length > 1)) {
			fs = rateFromTime(cols[0]);
			first = 1;
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
 * Refuses, from the bytes and before anything is decoded or split, a CSV whose first row is wider
 * than any recording: the cells of that row are counted by the commonest separator (, ; tab |) up
 * to its first line break. A quoted first row is left to the full reader.
 */
export function checkFirstRow(bytes: Uint8Array): void {
	const counts = new Map<number, number>([
		[0x2c, 0],
		[0x3b, 0],
		[0x09, 0],
		[0x7c, 0]
	]);
	for (let i = 0; i < bytes.length; i++) {
		const b = bytes[i];
		if (b === 0x0a || b === 0x0d) break;
		if (b === 0x22) return;
		const c = counts.get(b);
		if (c !== undefined) counts.set(b, c + 1);
	}
	const cells = Math.max(...counts.values()) + 1;
	if (cells > MAX_CHANNELS + 1)
		throw new RecordingError(
			`Row 1 has ${cells.toLocaleString('en')} columns; a recording has at most ${MAX_CHANNELS} channels and a time column.`,
			{ row: 1 }
		);
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

/**
 * Parses CSV text (server, tests) in chunks, so the row arrays of a large file never all exist at
 * once. `onChunk` reports progress as a fraction of characters read.
 */
export function parseCsvText(
	text: string,
	fileName: string,
	sampleRateHz: number | null = null,
	onChunk: (fraction: number) => void = () => {}
): Recording {
	checkSize(fileName, text.length);
	let comma = true;
	const collector = new CsvCollector(() => comma);
	let failure: unknown = null;
	// papaparse streams a string in chunks too, though its typings only admit that for files
	const config = {
		skipEmptyLines: true,
		delimitersToGuess: [',', ';', '\t', '|'],
		chunkSize: 1024 * 1024,
		chunk: (res: Papa.ParseResult<string[]>, parser: Papa.Parser) => {
			if (failure) return;
			comma = res.meta.delimiter === ',';
			try {
				collector.rows(res.data);
				onChunk(Math.min(1, res.meta.cursor / text.length));
			} catch (e) {
				failure = e;
				parser.abort();
			}
		}
	};
	Papa.parse<string[]>(text, config as unknown as Papa.ParseConfig<string[]>);
	if (failure) throw failure;
	return collector.finish(fileName, text.length, sampleRateHz);
}

/** Parses a CSV Blob in chunks (browser worker), reporting progress as a fraction of bytes read. */
export function parseCsvBlob(
	file: Blob & { name?: string },
	sampleRateHz: number | null,
	onProgress: (f: number) => void = () => {}
): Promise<Recording> {
	const name = file.name ?? 'recording.csv';
	checkSize(name, file.size);
	return new Promise((resolve, reject) => {
		let comma = true;
		const collector = new CsvCollector(() => comma);
		let failed = false;
		Papa.parse<string[]>(file as File, {
			skipEmptyLines: true,
			delimitersToGuess: [',', ';', '\t', '|'],
			chunkSize: 1024 * 1024,
			chunk: (res, parser) => {
				if (failed) return;
				comma = res.meta.delimiter === ',';
				try {
					collector.rows(res.data);
					onProgress(Math.min(1, res.meta.cursor / file.size));
				} catch (e) {
					failed = true;
					parser.abort();
					reject(e);
				}
			},
			complete: () => {
				if (failed) return;
				try {
					resolve(collector.finish(name, file.size, sampleRateHz));
				} catch (e) {
					reject(e);
				}
			},
			error: (err) => reject(new RecordingError(`${name} could not be read: ${err.message}`))
		});
	});
}
