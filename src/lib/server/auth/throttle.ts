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

export interface BackoffOptions {
	/** failures allowed before any wait */
	free: number;
	/** the first wait; each further failure doubles it */
	firstWaitMs: number;
	maxWaitMs: number;
	/** a key quiet this long starts again from nothing */
	forgetAfterMs: number;
}

/**
 * Per-account throttling that cannot be turned into a lock-out: after a few free failures each
 * further one makes the account wait a little longer (30 s, 1 min, 2 min … at most 15 min),
 * measured from the last failure; the holder can always try again soon, a guesser gets nowhere,
 * and an admin can lift it at once (Admin → Users).
 */
export class BackoffThrottle {
	readonly #keys = new Map<string, { count: number; lastAt: number }>();
	readonly #opts: BackoffOptions;

	constructor(opts: BackoffOptions) {
		this.#opts = opts;
	}

	#entry(key: string, now: number) {
		const e = this.#keys.get(key);
		if (e && now - e.lastAt > this.#opts.forgetAfterMs) {
			this.#keys.delete(key);
			return undefined;
		}
		return e;
	}

	#wait(count: number): number {
		if (count < this.#opts.free) return 0;
		return Math.min(this.#opts.maxWaitMs, this.#opts.firstWaitMs * 2 ** (count - this.#opts.free));
	}

	retryAfterMs(key: string, now = Date.now()): number {
		const e = this.#entry(key, now);
		return e ? Math.max(0, e.lastAt + this.#wait(e.count) - now) : 0;
	}

	/** The failures counted against the key now (for Admin → Users). */
	failures(key: string, now = Date.now()): number {
		return this.#entry(key, now)?.count ?? 0;
	}

	fail(key: string, now = Date.now()): void {
		const e = this.#entry(key, now) ?? { count: 0, lastAt: now };
		e.count++;
		e.lastAt = now;
		this.#keys.set(key, e);
		if (this.#keys.size > 50_000) for (const k of [...this.#keys.keys()]) this.#entry(k, now);
	}

	reset(key: string): void {
		this.#keys.delete(key);
	}
}

/**
 * Per account: 5 free failures, then 30 s doubling to 15 min. Per client address (a tablet, or
 * behind a proxy the address it reports with ADDRESS_HEADER/XFF_DEPTH): 30 failures in 15 minutes,
 * counted for that address only.
 */
export const accountThrottle = new BackoffThrottle({
	free: 5,
	firstWaitMs: 30_000,
	maxWaitMs: 15 * 60_000,
	forgetAfterMs: 60 * 60_000
});
export const addressThrottle = new FailureThrottle({ limit: 30, windowMs: 15 * 60_000 });
