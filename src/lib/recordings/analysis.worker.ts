/// <reference lib="webworker" />
/**
 * Parses and analyses a recording off the main thread, so the screen never freezes: messages
 * { file, sampleRateHz, choice } in; { type: 'progress' | 'done' | 'error' } out.
 */
import { parseRecordingFile } from './parse.ts';
import { analyzeRecording, defaultChoice, type AnalysisChoice } from './analyze.ts';
import { checkSize } from './types.ts';
import { overallLevel } from './level.ts';

interface Request {
	file: File;
	sampleRateHz: number | null;
	choice: AnalysisChoice | null;
	/** a record of the running machine without hits, subtracted from the bump test's spectrum */
	background?: File | null;
	/** the measured running speed, for the overall level's band (2 or 10 Hz up to 1000 Hz) */
	rpm?: number | null;
}

const post = (m: unknown) => (self as unknown as Worker).postMessage(m);

self.onmessage = async (e: MessageEvent<Request>) => {
	const { file, sampleRateHz, choice, background, rpm } = e.data;
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
			recording: {
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
			},
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
};
