/**
 * The audio thread's part of a tap capture: the input's 128-frame render quanta gathered into
 * blocks of `blockFrames` and sent, as they are, to the analysis worker on the port it was given.
 * Nothing is processed here: the audio thread must never wait.
 */

// the AudioWorkletGlobalScope, which TypeScript's DOM library does not describe
declare class AudioWorkletProcessor {
	readonly port: MessagePort;
	constructor(options?: unknown);
}
declare function registerProcessor(name: string, ctor: unknown): void;

interface Options {
	processorOptions: { channels: number; blockFrames: number };
}

class TapInputProcessor extends AudioWorkletProcessor {
	#channels: number;
	#frames: number;
	#block: Float32Array[];
	#fill = 0;
	#out: MessagePort | null = null;
	#open = true;

	constructor(options: Options) {
		super(options);
		this.#channels = options.processorOptions.channels;
		this.#frames = options.processorOptions.blockFrames;
		this.#block = this.#fresh();
		this.port.onmessage = (e: MessageEvent<{ port?: MessagePort; close?: boolean }>) => {
			if (e.data.port) this.#out = e.data.port;
			if (e.data.close) {
				this.#open = false;
				this.#out?.close();
			}
		};
	}

	#fresh() {
		return Array.from({ length: this.#channels }, () => new Float32Array(this.#frames));
	}

	process(inputs: Float32Array[][]): boolean {
		const input = inputs[0];
		if (!this.#open) return false;
		if (!input || input.length === 0 || !this.#out) return true;
		const n = input[0].length;
		for (let i = 0; i < n; i++) {
			for (let c = 0; c < this.#channels; c++) {
				// a mono input feeds every channel asked for only once: the rest stay silent
				const src = input[c] ?? null;
				this.#block[c][this.#fill] = src ? src[i] : 0;
			}
			if (++this.#fill === this.#frames) {
				const b = this.#block;
				this.#out.postMessage(
					{ channels: b },
					b.map((x) => x.buffer)
				);
				this.#block = this.#fresh();
				this.#fill = 0;
			}
		}
		return true;
	}
}

registerProcessor('detune-tap-input', TapInputProcessor);
