/**
 * A test-only server entry: the built app with a fault armed in its push path, for the tests that
 * kill or break the server mid-batch. Production starts `node build`, which never installs a probe.
 *
 * DETUNE_FAULT=hold@N  — at item N of the first batch that has one, with the items before it
 *                        written but not committed, say so on stdout and block (a test kills us)
 * DETUNE_FAULT=fail@N  — throw before item N of the first batch that has one
 * DETUNE_FAULT=fail-after-insert@N — throw at item N after its check row was inserted
 * Each fault fires once.
 */
import { resolve } from 'node:path';
import { pathToFileURL } from 'node:url';

const [kind, at] = (process.env.DETUNE_FAULT ?? '').split('@');
let armed = Boolean(kind);
/** @type {Record<symbol, unknown>} */ (/** @type {unknown} */ (globalThis))[
	Symbol.for('detune.pushProbe')
] = (/** @type {{ item: number, phase: string }} */ { item, phase }) => {
	if (!armed || item !== Number(at)) return;
	const wanted = kind === 'fail-after-insert' ? 'after-insert' : 'before-item';
	if (phase !== wanted) return;
	armed = false;
	if (kind === 'hold') {
		console.log(`[detune] test fault: batch held open at item ${item}`);
		Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, 60_000);
	} else throw new Error(`fault injected at item ${item} (${phase})`);
};

await import(pathToFileURL(resolve('build/index.js')).href);
