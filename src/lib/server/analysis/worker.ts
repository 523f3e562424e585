/**
 * The analysis worker thread's entry (piscina calls the default export once per task). Bundled on
 * its own into build/server/analysis-worker.js by the adapter step in svelte.config.js.
 */
import { runAnalysis } from './task.ts';

export default runAnalysis;
