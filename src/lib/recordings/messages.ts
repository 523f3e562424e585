/** What the analysis worker says about a file it analyses (a loaded one or a tap capture's). */
import type { Analysis, AnalysisChoice } from './analyze.ts';
import type { LevelResult } from './level.ts';
import type { SweepAnalysis, SweepChoice } from './sweep.ts';

export interface RecordingSummary {
	format: string;
	fileName: string;
	sizeBytes: number;
	sampleRateHz: number;
	durationS: number;
	note: string | null;
	channels: { name: string; unit: string; samples: number }[];
}

/** What the worker says while it works, or when it cannot go on. */
export type WorkerStatus =
	{ type: 'progress'; stage: string; fraction: number } | { type: 'error'; message: string };

export type AnalysisMessage =
	| WorkerStatus
	| {
			type: 'done';
			recording: RecordingSummary;
			choice: AnalysisChoice;
			analysis: Analysis;
			level: LevelResult | null;
			/** a tap capture's: when the block that closed its last hit reached the worker */
			lastHitAt?: number;
	  };

/** What the worker says about a speed-sweep file. */
export type SweepMessage =
	| WorkerStatus
	| {
			type: 'sweep-done';
			recording: RecordingSummary;
			choice: SweepChoice;
			analysis: SweepAnalysis;
	  };
