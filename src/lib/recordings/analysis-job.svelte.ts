/**
 * The screen's side of the analysis worker for a loaded file: it starts the worker, follows its
 * progress and keeps its error, and hands the finished result to the screen. The bump-test loader
 * and the speed sweep both use it; `keep` says whether the worker (and the file it has parsed)
 * stays for the next request, as the sweep's re-analysis with other channel roles needs.
 */
import type { ModeInput } from '../schemas/sync.ts';
import type { WorkerStatus } from './messages.ts';

/**
 * What a file's screen hands Floor check when the technician takes its modes: the modes, the file
 * (it waits in the outbox), the typed sample rate, and what the server needs to analyse it again.
 */
export type TakeModes<Extra> = (
	modes: ModeInput[],
	file: File,
	sampleRateHz: number | null,
	extra: Extra
) => void;

export class AnalysisJob<Done extends { type: string }> {
	busy = $state(false);
	stage = $state('');
	fraction = $state(0);
	error = $state<string | null>(null);
	#worker: Worker | null = null;
	readonly #ondone: (message: Done) => void;
	readonly #keep: boolean;

	constructor(ondone: (message: Done) => void, options: { keep?: boolean } = {}) {
		this.#ondone = ondone;
		this.#keep = options.keep ?? false;
	}

	/** Sends `request` to the worker (a new one unless this job keeps its worker). */
	start(request: unknown) {
		this.error = null;
		this.busy = true;
		this.fraction = 0;
		if (!this.#keep) this.stop();
		if (!this.#worker) {
			// eslint-disable-next-line svelte/prefer-svelte-reactivity -- the worker's address, never changed
			const worker = new Worker(new URL('./analysis.worker.ts', import.meta.url), {
				type: 'module'
			});
			worker.onmessage = (e) => this.receive(e.data);
			worker.onerror = (e) => this.fail(`The analysis stopped: ${e.message}`);
			this.#worker = worker;
		}
		this.#worker.postMessage(request);
	}

	/** Shows that work has begun elsewhere (a tap capture) whose messages come through `receive`. */
	expect() {
		this.error = null;
		this.busy = true;
		this.fraction = 0;
	}

	/** A message of the worker: progress, an error, or the result. */
	receive(message: WorkerStatus | Done) {
		if (message.type === 'progress') {
			const m = message as Extract<WorkerStatus, { type: 'progress' }>;
			this.stage = m.stage;
			this.fraction = m.fraction;
		} else if (message.type === 'error') {
			this.fail((message as Extract<WorkerStatus, { type: 'error' }>).message);
		} else {
			this.busy = false;
			if (!this.#keep) this.stop();
			this.#ondone(message as Done);
		}
	}

	/** An error the screen finds itself (bad input), shown where the worker's errors are. */
	fail(message: string) {
		this.error = message;
		this.busy = false;
	}

	stop() {
		this.#worker?.terminate();
		this.#worker = null;
	}
}
