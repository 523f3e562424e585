/**
 * Sign-in throttling per account and per client address: a fixed budget of failures in a sliding
 * window, then a lock-out until the oldest failure leaves the window. Kept in memory: one server
 * process serves a plant (see ../shared/product.md, "Scale"); a restart forgives.
 */
export interface ThrottleOptions {
	/** failures allowed in the window before the key is locked */
	limit: number;
	windowMs: number;
}

export class FailureThrottle {
	readonly #failures = new Map<string, number[]>();
	readonly #opts: ThrottleOptions;

	constructor(opts: ThrottleOptions) {
		this.#opts = opts;
	}

	#recent(key: string, now: number): number[] {
		const list = (this.#failures.get(key) ?? []).filter((t) => now - t < this.#opts.windowMs);
		if (list.length === 0) this.#failures.delete(key);
		else this.#failures.set(key, list);
		return list;
	}

	/** Milliseconds until the key may try again; 0 when it may try now. */
	retryAfterMs(key: string, now = Date.now()): number {
		const list = this.#recent(key, now);
		if (list.length < this.#opts.limit) return 0;
		return list[list.length - this.#opts.limit] + this.#opts.windowMs - now;
	}

	fail(key: string, now = Date.now()): void {
		const list = this.#recent(key, now);
		list.push(now);
		this.#failures.set(key, list);
		if (this.#failures.size > 50_000) this.#sweep(now);
	}

	/** Takes back one failure recorded at `at` (a slot reserved for an attempt that succeeded). */
	release(key: string, at: number): void {
		const list = this.#failures.get(key);
		const i = list?.indexOf(at) ?? -1;
		if (!list || i < 0) return;
		list.splice(i, 1);
		if (list.length === 0) this.#failures.delete(key);
	}

	reset(key: string): void {
		this.#failures.delete(key);
	}

	#sweep(now: number): void {
		for (const key of [...this.#failures.keys()]) this.#recent(key, now);
	}
}

/** 5 wrong passwords per account in 15 minutes; 30 per client address (a shared plant tablet). */
export const accountThrottle = new FailureThrottle({ limit: 5, windowMs: 15 * 60_000 });
export const addressThrottle = new FailureThrottle({ limit: 30, windowMs: 15 * 60_000 });
