/**
 * One upload's parse-and-analyse, as a pure function of its bytes: the body of the server's
 * analysis worker thread, and what runs in-process where no worker file was built (vite dev,
 * vitest). It imports nothing that opens the database or reads the environment, so a worker
 * thread can load it on its own.
 */
import { parseRecordingBytes } from '../../recordings/parse.ts';
import { analyzeRecording, defaultChoice } from '../../recordings/analyze.ts';
import { RecordingError } from '../../recordings/types.ts';
import { analyzeSweepRecording, type SweepChoice } from '../../recordings/sweep.ts';

export interface StoredAnalysis {
	/**
	 * background: a record of the running machine, kept for the bump tests analysed with it;
	 * sweep: a run-up or coast-down, its modes the resonances found (qFactor is their API 684 AF)
	 */
	kind: 'ringdown' | 'impact' | 'background' | 'sweep';
	modes: {
		frequencyHz: number;
		dampingRatio: number | null;
		qFactor: number | null;
		flags: string[];
	}[];
}

export interface AnalysisTask {
	bytes: Uint8Array;
	fileName: string;
	mediaType: string;
	sampleRateHz: number | null;
	/** parse only: a background record is stored, not searched for modes; a sweep is order-tracked */
	role?: 'background' | 'sweep';
	/** a sweep's channel roles and orders, as the technician chose them on the tablet */
	sweep?: SweepChoice | null;
	/** the background this bump test is analysed with (its spectrum subtracted) */
	background?: { bytes: Uint8Array; fileName: string; mediaType: string } | null;
}

/** What the server keeps of a parsed recording: its shape, never its samples. */
export interface RecordingShape {
	format: 'csv' | 'wav' | 'uff';
	sampleRateHz: number;
	channels: number;
	durationS: number;
}

/** A refused file is an answer, not a failure: it crosses the thread boundary as data. */
export type AnalysisOutcome =
	| { ok: true; shape: RecordingShape; analysis: StoredAnalysis }
	| { ok: false; message: string; row?: number; column?: number };

export function runAnalysis(task: AnalysisTask): AnalysisOutcome {
	try {
		const rec = parseRecordingBytes(task.bytes, task.fileName, task.mediaType, task.sampleRateHz);
		const shape = {
			format: rec.format,
			sampleRateHz: rec.sampleRateHz,
			channels: rec.channels.length,
			durationS: rec.durationS
		};
		if (task.role === 'background')
			return { ok: true, shape, analysis: { kind: 'background', modes: [] } };
		if (task.role === 'sweep') {
			if (!task.sweep) throw new RecordingError('A speed sweep needs its channel roles.');
			const sweep = analyzeSweepRecording(rec, task.sweep);
			const modes = sweep.result.pieces.flatMap((p) =>
				p.resonances.map((r) => ({
					frequencyHz: r.frequencyHz,
					dampingRatio: r.dampingRatio,
					qFactor: r.amplificationFactor,
					flags: [r.direction, `order-${r.order}`, ...r.flags]
				}))
			);
			return { ok: true, shape, analysis: { kind: 'sweep', modes } };
		}
		const bg = task.background
			? parseRecordingBytes(
					task.background.bytes,
					task.background.fileName,
					task.background.mediaType,
					task.sampleRateHz
				)
			: null;
		const a = analyzeRecording(rec, defaultChoice(rec), () => {}, bg);
		const modes = a.result.modes.map((m) => ({
			frequencyHz: m.frequencyHz,
			dampingRatio: m.dampingRatio,
			qFactor: m.qFactor,
			flags: m.flags as string[]
		}));
		return { ok: true, shape, analysis: { kind: a.kind, modes } };
	} catch (e) {
		if (e instanceof RecordingError)
			return { ok: false, message: e.message, row: e.row, column: e.column };
		throw e;
	}
}
