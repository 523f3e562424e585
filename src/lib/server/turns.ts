/**
 * Heavy writes take turns. Each runs synchronously (a better-sqlite3 transaction), so while one
 * runs nothing else in this process can; queued one after another and started from a fresh
 * event-loop turn (setImmediate), they leave room between them for the requests that arrived
 * meanwhile — a supervisor's board stays quick while fifty tablets sync at the end of a shift.
 * Used by the push, the asset import and the rule-set save (which recomputes its assets).
 */
let tail: Promise<unknown> = Promise.resolve();
let waiting = 0;

export function inTurn<T>(work: () => T): Promise<T> {
	waiting++;
	const run = tail
		.then(() => new Promise<void>((resolve) => setImmediate(resolve)))
		.then(() => {
			waiting--;
			return work();
		});
	tail = run.catch(() => undefined);
	return run;
}

/** How many writes wait for their turn. */
export const queued = () => waiting;
