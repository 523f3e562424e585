/**
 * Catching hits in a live input, block by block, as a portable data collector does: learn the noise
 * floor, arm, trigger when the trigger channel rises `levelOverNoise` times over that floor, keep a
 * pre-trigger share of the record from before the trigger, record the chosen length, then judge the
 * hit (overload near full scale, a double hit, too weak over the noise) and wait for the structure
 * to settle before arming again. Pure: the capture worker feeds it, the unit tests feed it too.
 */
import { hasSecondHit } from '../vibration/signal/ringdown.ts';

export const REJECT_REASONS = ['overload', 'double-hit', 'too-weak'] as const;
export type RejectReason = (typeof REJECT_REASONS)[number];

export const REJECT_TEXT: Record<RejectReason, string> = {
	overload: 'overload: the input reached full scale; strike softer or use a less sensitive range',
	'double-hit': 'double hit: the hammer struck twice; let it rebound freely',
	'too-weak': 'too weak: the hit barely rose over the noise; strike harder'
};

export interface TriggerSettings {
	sampleRateHz: number;
	/** channels in each block (1, or 2 with the hammer's force first) */
	channels: number;
	/** the channel that triggers: the hammer's force when there is one, else the response */
	triggerChannel: number;
	/** samples per hit record */
	recordSamples: number;
	/** share of the record kept from before the trigger (common practice: 5–10 %) */
	preTriggerFraction: number;
	/** the trigger level, as a multiple of the noise floor's r.m.s. (10 = 20 dB) */
	levelOverNoise: number;
	/** a hit whose peak is under this multiple of the noise floor is too weak (30 ≈ 30 dB) */
	minPeakOverNoise: number;
	/** a sample at or above this share of full scale is an overload */
	overloadFs: number;
}

export const TRIGGER_DEFAULTS = {
	preTriggerFraction: 0.05,
	levelOverNoise: 10,
	minPeakOverNoise: 30,
	overloadFs: 0.98
} as const;

export type CatcherState = 'learning' | 'armed' | 'recording' | 'settling';

export interface CaughtHit {
	/** the record, one array per channel, `recordSamples` long */
	channels: Float32Array[];
	/** where the trigger fired in the record (the pre-trigger length) */
	triggerAt: number;
	/** the largest |sample| of each channel, full scale */
	peakFs: number[];
	/** the noise floor (r.m.s., full scale) when the hit came */
	noiseFs: number;
	reason: RejectReason | null;
	/** the stream's sample count when the record closed */
	endSample: number;
}

/** 20 ms chunks: the noise floor is the median r.m.s. of the last second's chunks. */
const CHUNK_S = 0.02;
const NOISE_CHUNKS = 50;
/** a digital silence still has a floor: no trigger on a few bits of dither */
const MIN_NOISE_FS = 1e-6;
/** quiet chunks in a row before a settled structure is armed again */
const SETTLE_CHUNKS = 3;

export class HitCatcher {
	readonly settings: TriggerSettings;
	#state: CatcherState = 'learning';
	#pre: number;
	#chunk: number;
	/** the last `pre` samples of each channel, a ring */
	#ring: Float32Array[];
	#ringAt = 0;
	#seen = 0;
	#chunkSum = 0;
	#chunkPeak = 0;
	#chunkFill = 0;
	#noise: number[] = [];
	#quiet = 0;
	#record: Float32Array[] | null = null;
	#recordFill = 0;
	#noiseAtTrigger = 0;

	constructor(settings: TriggerSettings) {
		if (!(settings.recordSamples >= 64))
			throw new RangeError('A record needs at least 64 samples.');
		if (settings.triggerChannel < 0 || settings.triggerChannel >= settings.channels)
			throw new RangeError('The trigger channel is not one of the input channels.');
		this.settings = settings;
		this.#pre = Math.round(settings.preTriggerFraction * settings.recordSamples);
		this.#chunk = Math.max(16, Math.round(CHUNK_S * settings.sampleRateHz));
		this.#ring = Array.from({ length: settings.channels }, () => new Float32Array(this.#pre));
	}

	get state(): CatcherState {
		return this.#state;
	}

	/** the noise floor's r.m.s. (full scale), or null while it is still being learnt */
	get noiseFs(): number | null {
		if (this.#noise.length === 0) return null;
		const s = [...this.#noise].sort((a, b) => a - b);
		return Math.max(MIN_NOISE_FS, s[Math.floor(s.length / 2)]);
	}

	get triggerLevelFs(): number | null {
		const n = this.noiseFs;
		return n === null ? null : n * this.settings.levelOverNoise;
	}

	/** the samples seen so far */
	get samplesSeen(): number {
		return this.#seen;
	}

	/** Feeds one block (one array per channel, all the same length); returns the hits it closed. */
	push(block: ArrayLike<number>[]): CaughtHit[] {
		if (block.length !== this.settings.channels)
			throw new RangeError(`Expected ${this.settings.channels} channels, got ${block.length}.`);
		const n = block[0].length;
		const trig = block[this.settings.triggerChannel];
		const hits: CaughtHit[] = [];
		for (let i = 0; i < n; i++) {
			this.#seen++;
			if (this.#record) {
				for (let c = 0; c < block.length; c++) this.#record[c][this.#recordFill] = block[c][i];
				if (++this.#recordFill === this.settings.recordSamples) hits.push(this.#close());
				continue;
			}
			const v = trig[i];
			if (this.#state === 'armed' && Math.abs(v) > (this.triggerLevelFs as number)) {
				this.#open();
				for (let c = 0; c < block.length; c++) this.#record![c][this.#recordFill] = block[c][i];
				this.#recordFill++;
				continue;
			}
			for (let c = 0; c < block.length; c++) this.#ring[c][this.#ringAt] = block[c][i];
			if (this.#pre > 0) this.#ringAt = (this.#ringAt + 1) % this.#pre;
			this.#chunkSum += v * v;
			this.#chunkPeak = Math.max(this.#chunkPeak, Math.abs(v));
			if (++this.#chunkFill === this.#chunk) this.#endChunk();
		}
		return hits;
	}

	#endChunk() {
		const rms = Math.sqrt(this.#chunkSum / this.#chunk);
		const peak = this.#chunkPeak;
		this.#chunkSum = 0;
		this.#chunkPeak = 0;
		this.#chunkFill = 0;
		if (this.#state === 'settling') {
			// the ring-down must fall under the trigger level before the next hit is awaited
			const level = this.triggerLevelFs ?? Infinity;
			this.#quiet = peak < level ? this.#quiet + 1 : 0;
			if (this.#quiet >= SETTLE_CHUNKS) this.#state = 'armed';
			return;
		}
		this.#noise.push(rms);
		if (this.#noise.length > NOISE_CHUNKS) this.#noise.shift();
		// armed once a fifth of a second of noise is known and the pre-trigger ring is full
		if (
			this.#state === 'learning' &&
			this.#noise.length >= 10 &&
			this.#seen >= this.#pre + this.#chunk
		)
			this.#state = 'armed';
	}

	#open() {
		this.#state = 'recording';
		this.#noiseAtTrigger = this.noiseFs as number;
		this.#record = Array.from(
			{ length: this.settings.channels },
			() => new Float32Array(this.settings.recordSamples)
		);
		// the pre-trigger: the ring, oldest sample first
		for (let c = 0; c < this.settings.channels; c++) {
			const r = this.#ring[c];
			for (let k = 0; k < this.#pre; k++) this.#record[c][k] = r[(this.#ringAt + k) % this.#pre];
		}
		this.#recordFill = this.#pre;
	}

	#close(): CaughtHit {
		const channels = this.#record as Float32Array[];
		this.#record = null;
		this.#recordFill = 0;
		this.#state = 'settling';
		this.#quiet = 0;
		this.#chunkSum = 0;
		this.#chunkPeak = 0;
		this.#chunkFill = 0;
		const peakFs = channels.map((x) => {
			let m = 0;
			for (let i = 0; i < x.length; i++) m = Math.max(m, Math.abs(x[i]));
			return m;
		});
		return {
			channels,
			triggerAt: this.#pre,
			peakFs,
			noiseFs: this.#noiseAtTrigger,
			reason: judge(channels, peakFs, this.#noiseAtTrigger, this.settings),
			endSample: this.#seen
		};
	}
}

/** Why a hit is not fit to average, worst first; null when it is. */
export function judge(
	channels: Float32Array[],
	peakFs: number[],
	noiseFs: number,
	s: TriggerSettings
): RejectReason | null {
	if (peakFs.some((p) => p >= s.overloadFs)) return 'overload';
	const trig = channels[s.triggerChannel];
	if (hasSecondHit(trig, s.sampleRateHz)) return 'double-hit';
	if (peakFs[s.triggerChannel] < s.minPeakOverNoise * noiseFs) return 'too-weak';
	return null;
}
