/// <reference lib="webworker" />
/**
 * Parses and analyses a recording off the main thread, so the screen never freezes: messages
 * { file, sampleRateHz, choice } in; { type: 'progress' | 'done' | 'error' } out. A tap capture
 * runs here too: the audio input's blocks arrive on a port from the capture worklet
 * ('capture-open'), hits and live levels go out as 'capture-…' messages, and the finished capture
 * becomes a WAV file that takes the very same path as a loaded one.
 */
import { parseRecordingFile } from './parse.ts';
import { analyzeRecording, defaultChoice, type AnalysisChoice } from './analyze.ts';
import { checkSize } from './types.ts';
import { overallLevel } from './level.ts';
import { CaptureSession, type CaptureSettings } from '../capture/session.ts';
import { readTone } from '../capture/calibration.ts';
import { analyzeSweepRecording, defaultSweepChoice, sweepChoice } from './sweep.ts';
import type { Recording } from './types.ts';

interface FileRequest {
	type?: 'file';
	file: File;
	sampleRateHz: number | null;
	choice: AnalysisChoice | null;
	/** a record of the running machine without hits, subtracted from the bump test's spectrum */
	background?: File | null;
	/** the measured running speed, for the overall level's band (2 or 10 Hz up to 1000 Hz) */
	rpm?: number | null;
}

/** A speed sweep: roles chosen by the technician, or null for the file's own suggestion. */
interface SweepRequest {
	type: 'sweep';
	file: File;
	sampleRateHz: number | null;
	choice: unknown;
	/** the asset's vane or blade counts (orders to track by default) and top speed */
	passCounts: number[];
	maxRpm: number | null;
}

type CaptureRequest =
	| { type: 'capture-open'; port: MessagePort; settings: CaptureSettings; rpm: number | null }
	| { type: 'capture-keep'; index: number; kept: boolean }
	| { type: 'capture-average' }
	| { type: 'capture-close' }
	| {
			type: 'calibrate-open';
			port: MessagePort;
			sampleRateHz: number;
			seconds: number;
			referenceHz: number;
	  };

const post = (m: unknown, transfer: Transferable[] = []) =>
	(self as unknown as Worker).postMessage(m, transfer);
const now = () => performance.timeOrigin + performance.now();

/** What the screen shows of a parsed file (never its samples). */
function summaryOf(recording: Recording) {
	return {
		format: recording.format,
		fileName: recording.fileName,
		sizeBytes: recording.sizeBytes,
		sampleRateHz: recording.sampleRateHz,
		durationS: recording.durationS,
		note: recording.note ?? null,
		channels: recording.channels.map((c) => ({
			name: c.name,
			unit: c.unit,
			samples: c.samples.length
		}))
	};
}

/** The last sweep file read: a change of roles analyses it again without reading it again. */
let lastSweep: { file: File; sampleRateHz: number | null; recording: Recording } | null = null;

async function analyseSweep(req: SweepRequest) {
	try {
		checkSize(req.file.name, req.file.size);
		let recording: Recording;
		if (lastSweep && lastSweep.file === req.file && lastSweep.sampleRateHz === req.sampleRateHz)
			recording = lastSweep.recording;
		else {
			post({ type: 'progress', stage: 'Reading the file', fraction: 0 });
			recording = await parseRecordingFile(req.file, req.sampleRateHz, (f) =>
				post({ type: 'progress', stage: 'Reading the file', fraction: f * 0.6 })
			);
			lastSweep = { file: req.file, sampleRateHz: req.sampleRateHz, recording };
		}
		const parsed =
			req.choice === null
				? {
						success: true as const,
						data: defaultSweepChoice(recording, req.passCounts, req.maxRpm)
					}
				: sweepChoice.safeParse(req.choice);
		if (!parsed.success) {
			post({
				type: 'error',
				message: parsed.error.issues[0]?.message ?? 'Those roles cannot be used.'
			});
			return;
		}
		post({ type: 'progress', stage: 'Tracking the orders', fraction: 0.7 });
		const analysis = analyzeSweepRecording(recording, parsed.data);
		post({ type: 'sweep-done', recording: summaryOf(recording), choice: parsed.data, analysis });
	} catch (err) {
		post({ type: 'error', message: err instanceof Error ? err.message : String(err) });
	}
}

async function analyseFile(req: FileRequest, extra: Record<string, unknown> = {}) {
	const { file, sampleRateHz, choice, background, rpm } = req;
	try {
		checkSize(file.name, file.size);
		post({ type: 'progress', stage: 'Reading the file', fraction: 0 });
		const recording = await parseRecordingFile(file, sampleRateHz, (f) =>
			post({ type: 'progress', stage: 'Reading the file', fraction: f * 0.5 })
		);
		const pick = choice ?? defaultChoice(recording);
		const bg = background
			? (checkSize(background.name, background.size),
				await parseRecordingFile(background, sampleRateHz))
			: null;
		post({ type: 'progress', stage: 'Finding the modes', fraction: 0.5 });
		const analysis = analyzeRecording(
			recording,
			pick,
			(f) => post({ type: 'progress', stage: 'Finding the modes', fraction: 0.5 + f / 2 }),
			bg
		);
		post({
			type: 'done',
			...extra,
			recording: summaryOf(recording),
			choice: pick,
			analysis,
			// the running machine's overall vibration, from the background record's response channel
			level: bg
				? overallLevel(
						bg.channels[Math.min(pick.response, bg.channels.length - 1)],
						bg.sampleRateHz,
						rpm ?? null
					)
				: null
		});
	} catch (err) {
		post({ type: 'error', message: err instanceof Error ? err.message : String(err) });
	}
}

/**
 * Runs the analysis once on a made-up ring-down while the capture learns the noise floor: the
 * engine's code is compiled before the first real hit, whose result then comes in a fraction of the
 * time (the technician waits on that one; nothing of this run is kept or shown).
 */
function warmUp(sampleRateHz: number) {
	const n = Math.round(0.5 * sampleRateHz);
	const samples = new Float64Array(n);
	for (let i = 0; i < n; i++) {
		const t = i / sampleRateHz;
		samples[i] = Math.exp(-3 * t) * Math.sin(2 * Math.PI * 40 * t) + 1e-3 * Math.sin(i * 12.9898);
	}
	try {
		analyzeRecording(
			{
				format: 'wav',
				fileName: 'warm-up',
				sizeBytes: 0,
				sampleRateHz,
				durationS: 0.5,
				channels: [{ name: 'Response', unit: 'g', samples }]
			},
			{ response: 0, force: null }
		);
	} catch {
		// a warm-up that fails costs only its time
	}
}

let capture: { session: CaptureSession; port: MessagePort; rpm: number | null } | null = null;

/** The kept hits as a WAV file, handed to the screen (it travels with the check) and analysed. */
async function finishCapture() {
	if (!capture) return;
	try {
		const { bytes, fileName } = capture.session.wav(new Date());
		const file = new File([bytes as Uint8Array<ArrayBuffer>], fileName, { type: 'audio/wav' });
		post({ type: 'capture-file', file });
		await analyseFile(
			{ file, sampleRateHz: null, choice: null, rpm: capture.rpm },
			{ lastHitAt: capture.session.lastHitAt }
		);
	} catch (err) {
		post({ type: 'error', message: err instanceof Error ? err.message : String(err) });
	}
}

function handleCapture(m: CaptureRequest) {
	if (m.type === 'capture-open') {
		capture?.port.close();
		const session = new CaptureSession(m.settings, (e) => {
			post(e);
			if (e.type === 'capture-complete') void finishCapture();
		});
		capture = { session, port: m.port, rpm: m.rpm };
		setTimeout(() => warmUp(m.settings.sampleRateHz), 0);
		m.port.onmessage = (e: MessageEvent<{ channels: Float32Array[] }>) =>
			capture?.session.push(e.data.channels, now());
	} else if (m.type === 'calibrate-open') {
		// the calibrator's tone: `seconds` of the input, then its level in a band around the reference
		const want = Math.round(m.seconds * m.sampleRateHz);
		const samples = new Float32Array(want);
		let fill = 0;
		m.port.onmessage = (e: MessageEvent<{ channels: Float32Array[] }>) => {
			if (fill >= want) return;
			const x = e.data.channels[0];
			const take = Math.min(x.length, want - fill);
			samples.set(x.subarray(0, take), fill);
			fill += take;
			post({ type: 'calibration-progress', fraction: fill / want });
			if (fill < want) return;
			m.port.close();
			try {
				post({ type: 'calibration', reading: readTone(samples, m.sampleRateHz, m.referenceHz) });
			} catch (err) {
				post({ type: 'error', message: err instanceof Error ? err.message : String(err) });
			}
		};
	} else if (m.type === 'capture-close') {
		capture?.port.close();
		capture = null;
	} else if (capture && m.type === 'capture-keep') {
		const was = capture.session.complete;
		capture.session.setKept(m.index, m.kept);
		// a change to a complete capture's hits: average again
		if (capture.session.complete || was) void finishCapture();
	} else if (capture && m.type === 'capture-average') void finishCapture();
}

self.onmessage = (e: MessageEvent<FileRequest | CaptureRequest | SweepRequest>) => {
	const m = e.data;
	if (m.type === undefined || m.type === 'file') void analyseFile(m as FileRequest);
	else if (m.type === 'sweep') void analyseSweep(m);
	else handleCapture(m as CaptureRequest);
};
