/**
 * A seam for fault tests: an observer of push steps that a test-only server entry
 * (tests/support/fault-entry.js) or a unit test installs on globalThis. Production never installs
 * one, so the push path only asks "is there a probe?" and carries no test logic of its own.
 */
export type PushPhase = 'before-item' | 'after-insert';
export type PushProbe = (step: { item: number; phase: PushPhase; checkId: string | null }) => void;

const KEY = Symbol.for('detune.pushProbe');
type WithProbe = { [KEY]?: PushProbe };

export function pushProbe(): PushProbe | undefined {
	return (globalThis as WithProbe)[KEY];
}

/** Installs (or, with undefined, removes) the probe. For tests only. */
export function setPushProbe(probe: PushProbe | undefined): void {
	(globalThis as WithProbe)[KEY] = probe;
}
