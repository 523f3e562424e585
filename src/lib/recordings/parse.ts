/**
 * One way into a recording, for the tablet's worker and for the server alike: the format decided
 * by one rule (a .wav name or a WAV media type is WAV; a .csv/.txt name or a text type is CSV;
 * anything else is refused with the same message), then the WAV or CSV reader.
 */
import { checkFirstRow, parseCsvBlob, parseCsvText } from './csv.ts';
import { parseWav } from './wav.ts';
import { RecordingError, type Recording } from './types.ts';

export type RecordingFormat = 'wav' | 'csv';

export function formatOf(fileName: string, mediaType: string): RecordingFormat {
	if (/\.wav$/i.test(fileName) || /^audio\/(x-)?wav$/i.test(mediaType)) return 'wav';
	if (/\.(csv|txt)$/i.test(fileName) || /^text\//i.test(mediaType)) return 'csv';
	throw new RecordingError(`${fileName} is neither a CSV nor a WAV file.`);
}

/** From bytes in memory (the server, at upload). */
export function parseRecordingBytes(
	bytes: Uint8Array,
	fileName: string,
	mediaType: string,
	sampleRateHz: number | null
): Recording {
	if (formatOf(fileName, mediaType) === 'wav') return parseWav(bytes, fileName);
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
	return formatOf(file.name, file.type) === 'wav'
		? parseWav(new Uint8Array(await file.arrayBuffer()), file.name)
		: parseCsvBlob(file, sampleRateHz, onProgress);
}
