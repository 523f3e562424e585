/**
 * A bump test recorded on the tablet (tap capture) as a WAV file: the kept hits one after another,
 * float 32-bit samples as the input gave them (full scale), and in the file's INFO comment (ICMT)
 * what is needed to read them again: the sensor, its sensitivity, the record and pre-trigger
 * lengths and the hits left out. Any WAV reader sees the raw hits; Detune's reader (the tablet's
 * worker and the server alike) rebuilds the same averaged record from them.
 */
import { z } from 'zod';
import {
	SENSOR_KINDS,
	describeSensitivity,
	fullScalePerUnit,
	sensitivitySchema,
	unitOf
} from '../capture/sensors.ts';
import { REJECT_REASONS } from '../capture/trigger.ts';
import { WaveFile } from './wavefile.ts';
import { RecordingError, type Channel, type Recording } from './types.ts';

export const CAPTURE_MARK = 'detune-tap-capture';

export const captureMetaSchema = z.object({
	format: z.literal(CAPTURE_MARK),
	version: z.literal(1),
	sensor: z.object({
		name: z.string().max(80),
		kind: z.enum(SENSOR_KINDS),
		sensitivity: sensitivitySchema
	}),
	/** the channels' roles: the hammer's force first when there is one */
	channels: z
		.array(z.enum(['force', 'response']))
		.min(1)
		.max(2),
	recordSamples: z.number().int().min(64),
	preTriggerSamples: z.number().int().nonnegative(),
	/** hits taken and left out, by reason (they are not in the file) */
	rejected: z.partialRecord(z.enum([...REJECT_REASONS, 'by-hand']), z.number().int().min(0)),
	capturedAt: z.string().max(40)
});
export type CaptureMeta = z.infer<typeof captureMetaSchema>;

/** The WAV of the kept hits (each `meta.recordSamples` long, one array per channel). */
export function writeCaptureWav(
	hits: Float32Array[][],
	sampleRateHz: number,
	meta: CaptureMeta
): Uint8Array {
	if (hits.length === 0) throw new RangeError('There is no kept hit to save.');
	const L = meta.recordSamples;
	const n = meta.channels.length;
	const frames = L * hits.length;
	// the header and chunks by wavefile, the samples packed here: its per-value packing takes
	// some 20× longer, and a technician waits for this file's analysis
	const wav = new WaveFile();
	wav.fromScratch(
		n,
		sampleRateHz,
		'32f',
		Array.from({ length: n }, () => new Float32Array(1))
	);
	const bytes = new Uint8Array(frames * n * 4);
	const view = new DataView(bytes.buffer);
	hits.forEach((h, k) => {
		for (let i = 0; i < L; i++)
			for (let c = 0; c < n; c++) view.setFloat32(((k * L + i) * n + c) * 4, h[c][i], true);
	});
	(wav.data as { samples: Uint8Array }).samples = bytes;
	const fact = wav.fact as { dwSampleLength?: number } | undefined;
	if (fact && 'dwSampleLength' in fact) fact.dwSampleLength = frames;
	wav.setTag('ISFT', 'Detune tap capture');
	wav.setTag('ICMT', JSON.stringify(meta));
	return wav.toBuffer();
}

/** The capture details in a WAV's comment, or null for a WAV that is not a tap capture. */
export function captureMetaOf(comment: string | null, fileName: string): CaptureMeta | null {
	if (!comment || !comment.includes(CAPTURE_MARK)) return null;
	let json: unknown;
	try {
		json = JSON.parse(comment);
	} catch {
		throw new RecordingError(`${fileName}: its tap-capture details are damaged (not JSON).`);
	}
	const parsed = captureMetaSchema.safeParse(json);
	if (!parsed.success)
		throw new RecordingError(
			`${fileName}: its tap-capture details are damaged (${parsed.error.issues[0].path.join('.')}: ${parsed.error.issues[0].message}).`
		);
	return parsed.data;
}

/**
 * How far (in samples, within ±`reach`) hit `x` lies behind `ref` around the trigger: the lag of
 * the largest cross-correlation over the first 20 ms after the pre-trigger, so that the average
 * does not smear a mode whose first swing comes sooner or later with the hit's strength.
 */
export function alignmentLag(
	ref: ArrayLike<number>,
	x: ArrayLike<number>,
	from: number,
	span: number,
	reach: number
): number {
	let best = 0;
	let bestC = -Infinity;
	for (let lag = -reach; lag <= reach; lag++) {
		let c = 0;
		for (let i = from; i < from + span; i++) {
			const j = i + lag;
			if (j >= 0 && j < x.length && i < ref.length) c += ref[i] * x[j];
		}
		if (c > bestC) {
			bestC = c;
			best = lag;
		}
	}
	return best;
}

/**
 * The linear average of hits (each an array per channel), aligned on the trigger channel: hits
 * are shifted onto the first by their cross-correlation lag (at most 1 ms), the gaps left by a
 * shift count as zero.
 */
export function averageHits(
	hits: ArrayLike<number>[][],
	sampleRateHz: number,
	triggerChannel: number,
	preTriggerSamples: number
): Float64Array[] {
	const L = hits[0][0].length;
	const reach = Math.max(1, Math.round(0.001 * sampleRateHz));
	const span = Math.max(16, Math.min(L - preTriggerSamples, Math.round(0.02 * sampleRateHz)));
	const out = hits[0].map(() => new Float64Array(L));
	for (const h of hits) {
		const lag = alignmentLag(
			hits[0][triggerChannel],
			h[triggerChannel],
			preTriggerSamples,
			span,
			reach
		);
		h.forEach((x, c) => {
			for (let i = 0; i < L; i++) {
				const j = i + lag;
				if (j >= 0 && j < L) out[c][i] += x[j] / hits.length;
			}
		});
	}
	return out;
}

/** A capture WAV's raw channels (the hits back to back) read into the averaged record. */
export function recordingFromCapture(
	raw: Float64Array[],
	sampleRateHz: number,
	meta: CaptureMeta,
	fileName: string,
	sizeBytes: number
): Recording {
	const L = meta.recordSamples;
	if (raw.length !== meta.channels.length)
		throw new RecordingError(
			`${fileName}: its details name ${meta.channels.length} channel(s) but the file has ${raw.length}.`
		);
	const n = raw[0].length;
	if (n < L || n % L !== 0 || meta.preTriggerSamples >= L)
		throw new RecordingError(
			`${fileName}: ${n} samples per channel are not whole hits of ${L} samples; the file is damaged.`
		);
	const count = n / L;
	const hits = Array.from({ length: count }, (_, k) =>
		raw.map((c) => c.subarray(k * L, (k + 1) * L))
	);
	const trigger = meta.channels.indexOf('force') >= 0 ? meta.channels.indexOf('force') : 0;
	const avg = averageHits(hits, sampleRateHz, trigger, meta.preTriggerSamples);
	const unit = unitOf(meta.sensor.kind);
	const perUnit = fullScalePerUnit(meta.sensor.sensitivity);
	const channels: Channel[] = meta.channels.map((role, c) => {
		if (role === 'force') return { name: 'Force', unit: 'full scale', samples: avg[c] };
		const s = avg[c];
		for (let i = 0; i < s.length; i++) s[i] /= perUnit;
		return { name: meta.sensor.kind === 'microphone' ? 'Sound' : 'Response', unit, samples: s };
	});
	const left = Object.entries(meta.rejected)
		.filter(([, v]) => (v ?? 0) > 0)
		.map(([k, v]) => `${v} ${k === 'by-hand' ? 'left out by hand' : k.replace('-', ' ')}`);
	return {
		format: 'wav',
		fileName,
		sizeBytes,
		sampleRateHz,
		durationS: L / sampleRateHz,
		channels,
		note:
			`Tap capture: ${count} hit${count === 1 ? '' : 's'} averaged` +
			(left.length ? ` (${left.join(', ')})` : '') +
			`; ${meta.sensor.name}, ${describeSensitivity(meta.sensor.sensitivity, meta.sensor.kind)}` +
			(meta.sensor.kind === 'microphone'
				? '. A microphone measures sound, not the structure: confirm with an accelerometer.'
				: '.')
	};
}
