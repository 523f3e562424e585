/** A recording as parsed from a data collector's file: channels of samples at one sample rate. */
export interface Channel {
	name: string;
	unit: string;
	samples: Float64Array;
}

export interface Recording {
	format: 'csv' | 'wav' | 'uff';
	fileName: string;
	sizeBytes: number;
	sampleRateHz: number;
	durationS: number;
	channels: Channel[];
	/** how the channels were made, when they are not the file's samples as recorded */
	note?: string;
}

/** Files larger than this are refused before reading. */
export const MAX_RECORDING_BYTES = 50 * 1024 * 1024;

/** A problem with the file, said so a technician can fix it: what, and where. */
export class RecordingError extends Error {
	readonly row?: number;
	readonly column?: number;
	constructor(message: string, where: { row?: number; column?: number } = {}) {
		super(message);
		this.name = 'RecordingError';
		this.row = where.row;
		this.column = where.column;
	}
}

export function checkSize(name: string, bytes: number): void {
	if (bytes === 0) throw new RecordingError(`${name} is empty.`);
	if (bytes > MAX_RECORDING_BYTES)
		throw new RecordingError(
			`${name} is ${(bytes / 1048576).toFixed(1)} MB; recordings may be at most 50 MB.`
		);
}

/** What any recording must declare: sample rate and channels within what a bump test uses. */
export const SAMPLE_RATE_LIMITS = { minHz: 1, maxHz: 1_000_000 } as const;
export const MAX_CHANNELS = 16;

export function checkSampleRate(name: string, hz: number): void {
	if (!Number.isFinite(hz) || hz < SAMPLE_RATE_LIMITS.minHz || hz > SAMPLE_RATE_LIMITS.maxHz)
		throw new RecordingError(
			`${name}: a sample rate of ${Number.isFinite(hz) ? hz : String(hz)} Hz is outside 1 Hz – 1 MHz.`
		);
}

export function checkChannels(name: string, n: number): void {
	if (!Number.isInteger(n) || n < 1 || n > MAX_CHANNELS)
		throw new RecordingError(`${name}: ${n} channels; a recording has 1 to ${MAX_CHANNELS}.`);
}
