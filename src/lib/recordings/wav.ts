/** WAV recordings (PCM 16/24/32-bit, float 32/64; one or more channels) through wavefile. */
import { WaveFile } from './wavefile.ts';
import { captureMetaOf, recordingFromCapture } from './capture.ts';
import {
	RecordingError,
	checkChannels,
	checkSampleRate,
	checkSize,
	type Recording
} from './types.ts';

const text = (b: Uint8Array, at: number) =>
	String.fromCharCode(b[at], b[at + 1], b[at + 2], b[at + 3]);

export function parseWav(bytes: Uint8Array, fileName: string): Recording {
	checkSize(fileName, bytes.length);
	if (bytes.length < 44 || text(bytes, 0) !== 'RIFF' || text(bytes, 8) !== 'WAVE') {
		throw new RecordingError(
			`${fileName} is not a WAV file (it does not start with a RIFF/WAVE header).`
		);
	}
	const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	// find the data chunk and compare its declared size with what is there
	let at = 12;
	let dataSize = -1;
	let dataAt = -1;
	while (at + 8 <= bytes.length) {
		const id = text(bytes, at);
		const size = view.getUint32(at + 4, true);
		if (id === 'data') {
			dataSize = size;
			dataAt = at + 8;
			break;
		}
		at += 8 + size + (size % 2);
	}
	if (dataAt < 0)
		throw new RecordingError(`${fileName} has no data chunk: the file is truncated or damaged.`);
	if (dataAt + dataSize > bytes.length) {
		throw new RecordingError(
			`${fileName} is truncated: its header promises ${dataSize} bytes of samples but only ${bytes.length - dataAt} are there.`
		);
	}
	let wav: WaveFile;
	try {
		wav = new WaveFile(bytes);
	} catch (e) {
		throw new RecordingError(`${fileName} could not be read as WAV: ${(e as Error).message}`);
	}
	const fmt = wav.fmt as {
		audioFormat: number;
		numChannels: number;
		sampleRate: number;
		bitsPerSample: number;
	};
	const float =
		fmt.audioFormat === 3 ||
		(fmt.audioFormat === 65534 && (wav.bitDepth === '32f' || wav.bitDepth === '64'));
	const supported = float
		? [32, 64].includes(fmt.bitsPerSample)
		: [16, 24, 32].includes(fmt.bitsPerSample) && [1, 65534].includes(fmt.audioFormat);
	if (!supported) {
		throw new RecordingError(
			`${fileName} is ${float ? 'float' : 'PCM'} ${fmt.bitsPerSample}-bit (format ${fmt.audioFormat}); Detune reads PCM 16/24/32-bit and float 32/64-bit WAV.`
		);
	}
	checkChannels(fileName, fmt.numChannels);
	checkSampleRate(fileName, fmt.sampleRate);
	const chans = decodeChannels(
		(wav.data as { samples: Uint8Array }).samples,
		fmt.numChannels,
		fmt.bitsPerSample,
		float
	);
	const scale = float ? 1 : 2 ** (fmt.bitsPerSample - 1);
	// a bump test recorded on the tablet: its hits, averaged as the capture screen did
	const capture = captureMetaOf(wav.getTag('ICMT'), fileName);
	if (capture)
		return recordingFromCapture(
			chans.map((c) => (scale === 1 ? c : c.map((v) => v / scale))),
			fmt.sampleRate,
			capture,
			fileName,
			bytes.length
		);
	const channels = chans.map((c, i) => {
		const s = new Float64Array(c.length);
		for (let k = 0; k < c.length; k++) s[k] = c[k] / scale;
		return {
			name: chans.length === 1 ? 'Response' : `Channel ${i + 1}`,
			unit: 'full scale',
			samples: s
		};
	});
	const n = channels[0]?.samples.length ?? 0;
	if (n < 64)
		throw new RecordingError(`${fileName} holds only ${n} samples; a bump test needs at least 64.`);
	return {
		format: 'wav',
		fileName,
		sizeBytes: bytes.length,
		sampleRateHz: fmt.sampleRate,
		durationS: n / fmt.sampleRate,
		channels
	};
}

/**
 * The data chunk's interleaved little-endian samples, one array per channel (integers for PCM,
 * as stored; values for float). wavefile's own getSamples unpacks a value at a time through its
 * generic codec, some 20× slower: a tap capture's result waits on this read.
 */
export function decodeChannels(
	bytes: Uint8Array,
	channels: number,
	bits: number,
	float: boolean
): Float64Array[] {
	const width = bits / 8;
	const frames = Math.floor(bytes.length / (width * channels));
	const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
	const out = Array.from({ length: channels }, () => new Float64Array(frames));
	const read: (at: number) => number = float
		? bits === 32
			? (at) => view.getFloat32(at, true)
			: (at) => view.getFloat64(at, true)
		: bits === 16
			? (at) => view.getInt16(at, true)
			: bits === 24
				? (at) => ((bytes[at] | (bytes[at + 1] << 8) | (bytes[at + 2] << 16)) << 8) >> 8
				: (at) => view.getInt32(at, true);
	for (let i = 0, at = 0; i < frames; i++)
		for (let c = 0; c < channels; c++, at += width) out[c][i] = read(at);
	return out;
}
