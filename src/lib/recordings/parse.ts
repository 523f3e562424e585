/**
 * One way into a recording, for the tablet's worker and for the server alike: the format decided
 * by one rule (a .wav name or a WAV media type is WAV; a .csv/.txt name or a text type is CSV;
 * anything else is refused with the same message), then the WAV or CSV reader.
 */
import { checkFirstRow, parseCsvBlob, parseCsvText } from './csv.ts';
import { parseWav } from './wav.ts';
import { readUff, recordingFromUff } from './uff.ts';
import { RecordingError, type Recording } from './types.ts';

export type RecordingFormat = 'wav' | 'csv' | 'uff';

export function formatOf(fileName: string, mediaType: string): RecordingFormat {
	if (/\.wav$/i.test(fileName) || /^audio\/(x-)?wav$/i.test(mediaType)) return 'wav';
	// Universal File Format (dataset 58 / 58b): .uff or .unv by custom
	if (/\.(uff|unv)$/i.test(fileName)) return 'uff';
	if (/\.(csv|txt)$/i.test(fileName) || /^text\//i.test(mediaType)) return 'csv';
	throw new RecordingError(`${fileName} is neither a CSV nor a WAV file (nor a UFF .uff / .unv).`);
}

/** From bytes in memory (the server, at upload). */
export function parseRecordingBytes(
	bytes: Uint8Array,
	fileName: string,
	mediaType: string,
	sampleRateHz: number | null
): Recording {
	const format = formatOf(fileName, mediaType);
	if (format === 'wav') return parseWav(bytes, fileName);
	if (format === 'uff') return recordingFromUff(readUff(bytes), fileName, bytes.length);
	checkFirstRow(bytes);
	return parseCsvText(new TextDecoder().decode(bytes), fileName, sampleRateHz);
}

/**
 * What can be refused from a file's name, type and first row alone, before it is handed to the
 * analysis thread (the server, at upload).
 */
export function preflight(bytes: Uint8Array, fileName: string, mediaType: string): void {
	if (formatOf(fileName, mediaType) === 'csv') checkFirstRow(bytes);
}

/** From a File (the tablet's worker): a CSV is read in chunks, with progress. */
export async function parseRecordingFile(
	file: File,
	sampleRateHz: number | null,
	onProgress: (fraction: number) => void = () => {}
): Promise<Recording> {
	const format = formatOf(file.name, file.type);
	if (format === 'wav') return parseWav(new Uint8Array(await file.arrayBuffer()), file.name);
	if (format === 'uff') {
		const bytes = new Uint8Array(await file.arrayBuffer());
		return recordingFromUff(readUff(bytes), file.name, bytes.length);
	}
	return parseCsvBlob(file, sampleRateHz, onProgress);
}
