/**
 * One tap capture, as the analysis worker runs it: blocks from the audio input go to the hit
 * catcher; the screen gets the live level, a live spectrum while armed, and each hit as it closes
 * (kept, or left out with the reason); once the wanted number of hits is kept the capture is
 * complete and its WAV is built (recordings/capture.ts) for the same analysis as a loaded file.
 */
import { hannWindow, runMaxima, windowedAmplitude } from '../vibration/signal/spectrum.ts';
import { HitCatcher, TRIGGER_DEFAULTS, type CaughtHit, type RejectReason } from './trigger.ts';
import type { Sensor } from './sensors.ts';
import { writeCaptureWav, type CaptureMeta } from '../recordings/capture.ts';

export interface CaptureSettings {
	sampleRateHz: number;
	/** 1: the response; 2: the hammer's force, then the response */
	channels: 1 | 2;
	recordS: number;
	preTriggerFraction: number;
	levelOverNoise: number;
	hitsWanted: number;
	sensor: Pick<Sensor, 'name' | 'kind' | 'sensitivity'>;
	/** for the file's name */
	assetTag: string;
}

export interface HitSummary {
	index: number;
	reason: RejectReason | null;
	kept: boolean;
	peakFs: number[];
	/** the response channel's envelope, |x| at most per step, for a thumbnail */
	preview: number[];
	durationS: number;
}

export type CaptureEvent =
	| {
			type: 'capture-level';
			state: 'learning' | 'armed' | 'recording' | 'settling' | 'complete';
			peakFs: number;
			rmsFs: number;
			noiseFs: number | null;
			triggerFs: number | null;
	  }
	| { type: 'capture-spectrum'; frequencyHz: number[]; db: number[] }
	| { type: 'capture-hit'; hit: HitSummary; kept: number; wanted: number }
	| { type: 'capture-complete'; kept: number };

const LEVEL_EVERY_S = 0.1;
const SPECTRUM_EVERY_S = 0.3;
const SPECTRUM_N = 4096;
const PREVIEW_POINTS = 240;
const SPECTRUM_POINTS = 256;

export class CaptureSession {
	readonly settings: CaptureSettings;
	readonly catcher: HitCatcher;
	#emit: (e: CaptureEvent) => void;
	#hits: { hit: CaughtHit; kept: boolean }[] = [];
	#complete = false;
	#peak = 0;
	#sum = 0;
	#count = 0;
	#sinceSpectrum = 0;
	/** the response channel's latest samples, for the live spectrum */
	#tail = new Float32Array(SPECTRUM_N);
	#tailAt = 0;
	/** the tail in time order, for the spectrum */
	#ordered = new Float64Array(SPECTRUM_N);
	/** when the block that closed the latest hit arrived (ms since 1970, high resolution) */
	lastHitAt = 0;

	constructor(settings: CaptureSettings, emit: (e: CaptureEvent) => void) {
		if (!(settings.recordS > 0) || !(settings.sampleRateHz > 0))
			throw new RangeError('A capture needs a record length and a sample rate.');
		this.settings = settings;
		this.#emit = emit;
		this.catcher = new HitCatcher({
			sampleRateHz: settings.sampleRateHz,
			channels: settings.channels,
			triggerChannel: 0,
			recordSamples: Math.round(settings.recordS * settings.sampleRateHz),
			preTriggerFraction: settings.preTriggerFraction,
			levelOverNoise: settings.levelOverNoise,
			minPeakOverNoise: Math.max(TRIGGER_DEFAULTS.minPeakOverNoise, 3 * settings.levelOverNoise),
			overloadFs: TRIGGER_DEFAULTS.overloadFs
		});
	}

	get kept(): number {
		return this.#hits.filter((h) => h.kept).length;
	}

	get complete(): boolean {
		return this.#complete;
	}

	/** One block from the input (one array per channel); `arrivedAt` for the latency figure. */
	push(block: Float32Array[], arrivedAt: number): void {
		const resp = block[block.length - 1];
		this.#meter(resp, block[0]);
		// the catcher always sees the input (its noise floor and pre-trigger stay current); a hit
		// that closes once the capture is complete is not taken
		for (const hit of this.catcher.push(block)) {
			if (this.#complete) continue;
			{
				const kept = hit.reason === null;
				this.#hits.push({ hit, kept });
				this.lastHitAt = arrivedAt;
				this.#emit({
					type: 'capture-hit',
					hit: this.#summary(this.#hits.length - 1),
					kept: this.kept,
					wanted: this.settings.hitsWanted
				});
				if (this.kept >= this.settings.hitsWanted) {
					this.#complete = true;
					this.#emit({ type: 'capture-complete', kept: this.kept });
				}
			}
		}
	}

	/** The technician keeps or leaves out hit `index`; fewer than wanted kept re-arms the capture. */
	setKept(index: number, kept: boolean): void {
		const h = this.#hits[index];
		if (!h) throw new RangeError(`There is no hit ${index + 1}.`);
		h.kept = kept;
		this.#complete = this.kept >= this.settings.hitsWanted;
	}

	/** The WAV of the kept hits, with what is needed to average them again on the server. */
	wav(capturedAt: Date): { bytes: Uint8Array; fileName: string } {
		const kept = this.#hits.filter((h) => h.kept);
		if (kept.length === 0) throw new RangeError('No hit is kept: take a hit first.');
		const rejected: CaptureMeta['rejected'] = {};
		for (const h of this.#hits.filter((x) => !x.kept)) {
			const k = h.hit.reason ?? 'by-hand';
			rejected[k] = (rejected[k] ?? 0) + 1;
		}
		const meta: CaptureMeta = {
			format: 'detune-tap-capture',
			version: 1,
			sensor: { ...this.settings.sensor },
			channels: this.settings.channels === 2 ? ['force', 'response'] : ['response'],
			recordSamples: this.catcher.settings.recordSamples,
			preTriggerSamples: kept[0].hit.triggerAt,
			rejected,
			capturedAt: capturedAt.toISOString()
		};
		const stamp = capturedAt.toISOString().slice(0, 16).replace(/[-:]/g, '').replace('T', '-');
		const tag = this.settings.assetTag.replace(/[^A-Za-z0-9._-]+/g, '-').slice(0, 40) || 'asset';
		return {
			bytes: writeCaptureWav(
				kept.map((h) => h.hit.channels),
				this.settings.sampleRateHz,
				meta
			),
			fileName: `tap-${tag}-${stamp}.wav`
		};
	}

	#summary(index: number): HitSummary {
		const { hit, kept } = this.#hits[index];
		const x = hit.channels[hit.channels.length - 1];
		const step = Math.max(1, Math.ceil(x.length / PREVIEW_POINTS));
		const preview: number[] = [];
		for (let i = 0; i < x.length; i += step) {
			let m = 0;
			for (let k = i; k < Math.min(x.length, i + step); k++) m = Math.max(m, Math.abs(x[k]));
			preview.push(m);
		}
		return {
			index,
			reason: hit.reason,
			kept,
			peakFs: hit.peakFs,
			preview,
			durationS: x.length / this.settings.sampleRateHz
		};
	}

	#meter(resp: Float32Array, trig: Float32Array) {
		const fs = this.settings.sampleRateHz;
		for (let i = 0; i < resp.length; i++) {
			const v = trig[i];
			this.#peak = Math.max(this.#peak, Math.abs(v), Math.abs(resp[i]));
			this.#sum += v * v;
			this.#tail[this.#tailAt] = resp[i];
			this.#tailAt = (this.#tailAt + 1) % SPECTRUM_N;
		}
		this.#count += resp.length;
		this.#sinceSpectrum += resp.length;
		if (this.#count >= LEVEL_EVERY_S * fs) {
			this.#emit({
				type: 'capture-level',
				state: this.#complete ? 'complete' : this.catcher.state,
				peakFs: this.#peak,
				rmsFs: Math.sqrt(this.#sum / this.#count),
				noiseFs: this.catcher.noiseFs,
				triggerFs: this.catcher.triggerLevelFs
			});
			this.#peak = 0;
			this.#sum = 0;
			this.#count = 0;
		}
		if (this.#sinceSpectrum >= SPECTRUM_EVERY_S * fs && this.catcher.state === 'armed') {
			this.#sinceSpectrum = 0;
			this.#emit({ type: 'capture-spectrum', ...this.#spectrum() });
		}
	}

	/** dB re full scale of the latest 4096 samples (Hann), the loudest bin of each display step */
	#spectrum(): { frequencyHz: number[]; db: number[] } {
		const n = SPECTRUM_N;
		for (let i = 0; i < n; i++) this.#ordered[i] = this.#tail[(this.#tailAt + i) % n];
		const amplitude = windowedAmplitude(this.#ordered, 0, hannWindow(n), n);
		const df = this.settings.sampleRateHz / n;
		const step = Math.ceil(n / 2 / SPECTRUM_POINTS);
		const loudest = runMaxima(amplitude, 1, n / 2, step);
		const frequencyHz: number[] = [];
		const db: number[] = [];
		loudest.forEach((m, c) => {
			frequencyHz.push((1 + c * step + step / 2) * df);
			db.push(20 * Math.log10(Math.max(1e-9, m)));
		});
		return { frequencyHz, db };
	}
}
