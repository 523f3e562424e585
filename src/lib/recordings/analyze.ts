/**
 * From a parsed recording to modes: one channel → ring-down analysis; a force and a response
 * channel → the two-channel FRF. The same function runs in the browser worker, on the server at
 * ingest and in the tests.
 */
import {
	analyzeImpact,
	analyzeRingdown,
	type ImpactResult,
	type RingdownResult
} from '../vibration/index.ts';
import type { ResponseKind } from '../vibration/damping.ts';
import { RecordingError, type Recording } from './types.ts';
import { formatHz } from '../format.ts';

/** What a channel measures, from its unit (an accelerometer when the unit says nothing). */
export function responseKindOf(unit: string): ResponseKind {
	const u = unit.trim().toLowerCase();
	if (/^(mm|m|in|ips|µm)\/s$|^ips$|^in\/sec$/.test(u)) return 'velocity';
	if (/^(µm|um|mm|mil|mils|m)$/.test(u)) return 'displacement';
	return 'acceleration';
}

export interface AnalysisChoice {
	/** index of the response channel */
	response: number;
	/** index of the hammer force channel, or null for a response-only bump test */
	force: number | null;
	exponentialWindowS?: number | null;
}

export type Analysis =
	| { kind: 'ringdown'; result: RingdownResult }
	| { kind: 'impact'; result: ImpactResult; ringdown: RingdownResult };

/** Guesses the channels: a channel named like a force (or in N/lbf) is the hammer. */
export function defaultChoice(r: Recording): AnalysisChoice {
	const force = r.channels.findIndex(
		(c) => /force|hammer|kraft|^f$/i.test(c.name) || /^(n|lbf|kn)$/i.test(c.unit)
	);
	const response = r.channels.findIndex((_, i) => i !== force);
	return {
		response: Math.max(0, response),
		force: force >= 0 && r.channels.length > 1 ? force : null
	};
}

export function analyzeRecording(
	r: Recording,
	choice: AnalysisChoice,
	onProgress: (f: number) => void = () => {},
	background: Recording | null = null
): Analysis {
	const resp = r.channels[choice.response];
	if (!resp) throw new Error(`There is no channel ${choice.response + 1}.`);
	// the background of the running machine: the same channel, at the same sample rate
	let bg: Float64Array | null = null;
	if (background) {
		if (Math.abs(background.sampleRateHz - r.sampleRateHz) > 1e-3 * r.sampleRateHz)
			throw new RecordingError(
				`The background was recorded at ${formatHz(background.sampleRateHz)} and the bump test at ${formatHz(r.sampleRateHz)}: record both at the same rate.`
			);
		const ch = background.channels[Math.min(choice.response, background.channels.length - 1)];
		bg = ch.samples;
	}
	const responseKind = responseKindOf(resp.unit);
	const ringdown = analyzeRingdown(resp.samples, r.sampleRateHz, {
		exponentialWindowS: choice.exponentialWindowS ?? null,
		responseKind,
		background: bg,
		onProgress: (f) => onProgress(choice.force === null ? f : f / 2)
	});
	if (choice.force === null) return { kind: 'ringdown', result: ringdown };
	const force = r.channels[choice.force];
	const result = analyzeImpact(force.samples, resp.samples, r.sampleRateHz, {
		exponentialWindowS: choice.exponentialWindowS ?? null,
		responseKind,
		onProgress: (f) => onProgress(0.5 + f / 2)
	});
	return { kind: 'impact', result, ringdown };
}
