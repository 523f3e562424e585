/**
 * A speed-sweep recording (run-up or coast-down) into resonances: the channel roles (which is the
 * vibration, which the tachometer or the speed in rpm, pulses per turn, the orders to track),
 * guessed from the channels' names and shapes and then chosen by the technician; the same
 * analysis runs in the tablet's worker and on the server at ingest.
 */
import { z } from 'zod';
import {
	analyzeSweep,
	revolutionsFromSpeed,
	revolutionsFromTach,
	type Revolutions,
	type SweepResult
} from '../vibration/index.ts';
import { RecordingError, type Recording } from './types.ts';

export const MAX_ORDER = 64;

export const sweepChoice = z
	.object({
		/** index of the vibration channel */
		response: z.int().min(0).max(15),
		speed: z.discriminatedUnion('kind', [
			z
				.object({
					kind: z.literal('tach'),
					channel: z.int().min(0).max(15),
					pulsesPerRev: z.int().min(1, 'Pulses per revolution: at least 1.').max(360),
					polarity: z.enum(['auto', 'rising', 'falling']).default('auto')
				})
				.strict(),
			z.object({ kind: z.literal('rpm'), channel: z.int().min(0).max(15) }).strict()
		]),
		orders: z
			.array(z.int().min(1).max(MAX_ORDER))
			.min(1, 'Track at least one order.')
			.max(6, 'Track at most six orders at once.'),
		/** the asset's top speed: edges closer than half a pulse interval there are one */
		maxRpm: z.number().positive().max(100_000).nullable().default(null)
	})
	.strict()
	.refine((c) => c.response !== c.speed.channel, {
		message: 'The vibration channel and the speed channel must be different channels.'
	});

export type SweepChoice = z.infer<typeof sweepChoice>;

const TACH_NAMES = /tach|key ?phasor|keyphasor|once|1\/rev|opr|trigger|pulse|phase ref|ref/i;
const RPM_NAMES = /rpm|speed|drehzahl/i;

/** How far a channel is from two-level: the share of samples near its extremes (a pulse train ≈ 1). */
function twoLevel(x: Float64Array): number {
	let lo = Infinity;
	let hi = -Infinity;
	const step = Math.max(1, Math.floor(x.length / 20000));
	for (let i = 0; i < x.length; i += step) {
		lo = Math.min(lo, x[i]);
		hi = Math.max(hi, x[i]);
	}
	const span = hi - lo;
	if (!(span > 0)) return 0;
	let near = 0;
	let n = 0;
	for (let i = 0; i < x.length; i += step, n++) {
		const f = (x[i] - lo) / span;
		if (f < 0.15 || f > 0.85) near++;
	}
	return near / n;
}

/**
 * The channel roles a file suggests: a channel named like a speed (or in rpm) is the speed; one
 * named like a tachometer, or else the most two-level channel (a pulse train spends nearly all its
 * time at its two levels), is the tachometer; the vibration is the first other channel. Orders:
 * 1× and 2×, and the asset's vane or blade pass when it has one.
 */
export function defaultSweepChoice(
	r: Recording,
	passCounts: number[] = [],
	maxRpm: number | null = null
): SweepChoice {
	if (r.channels.length < 2)
		throw new RecordingError(
			`${r.fileName} has one channel; a speed sweep needs the vibration and a tachometer (or speed) channel.`
		);
	const orders = [...new Set([1, 2, ...passCounts.filter((k) => k >= 3 && k <= MAX_ORDER)])].slice(
		0,
		6
	);
	const rpmAt = r.channels.findIndex((c) => RPM_NAMES.test(c.name) || /^rpm$/i.test(c.unit));
	if (rpmAt >= 0)
		return {
			response: r.channels.findIndex((_, i) => i !== rpmAt),
			speed: { kind: 'rpm', channel: rpmAt },
			orders,
			maxRpm
		};
	let tachAt = r.channels.findIndex((c) => TACH_NAMES.test(c.name));
	if (tachAt < 0) {
		const shape = r.channels.map((c) => twoLevel(c.samples));
		tachAt = shape.indexOf(Math.max(...shape));
	}
	return {
		response: r.channels.findIndex((_, i) => i !== tachAt),
		speed: { kind: 'tach', channel: tachAt, pulsesPerRev: 1, polarity: 'auto' },
		orders,
		maxRpm
	};
}

export interface SweepAnalysis {
	result: SweepResult;
	unit: string;
	responseName: string;
	tach: {
		source: 'tach' | 'rpm';
		polarity: Revolutions['polarity'];
		revolutions: number;
		pulses: number;
		missing: number;
		extra: number;
		guarded: number;
		gaps: { fromS: number; toS: number }[];
	};
}

/** The analysis of a sweep recording under the chosen roles; a problem is a RecordingError. */
export function analyzeSweepRecording(r: Recording, choice: SweepChoice): SweepAnalysis {
	const resp = r.channels[choice.response];
	const sp = r.channels[choice.speed.channel];
	if (!resp || !sp)
		throw new RecordingError(
			`${r.fileName} has ${r.channels.length} channels; channel ${Math.max(choice.response, choice.speed.channel) + 1} is not one of them.`
		);
	if (choice.speed.kind === 'tach') {
		const share = twoLevel(sp.samples);
		if (share < 0.6)
			throw new RecordingError(
				`“${sp.name}” does not look like a tachometer: it spends ${Math.round(share * 100)} % of the time at its two levels, where a pulse train spends nearly all. Choose the channel with the once-per-revolution pulses.`
			);
	}
	let revs: Revolutions;
	try {
		revs =
			choice.speed.kind === 'tach'
				? revolutionsFromTach(sp.samples, r.sampleRateHz, {
						pulsesPerRev: choice.speed.pulsesPerRev,
						polarity: choice.speed.polarity,
						maxRpm: choice.maxRpm
					})
				: revolutionsFromSpeed(sp.samples, r.sampleRateHz);
	} catch (e) {
		throw new RecordingError(
			`“${sp.name}” does not read as a ${choice.speed.kind === 'tach' ? 'tachometer (one pulse per mark)' : 'speed in rpm'}: ${(e as Error).message}. Choose the channel that is.`
		);
	}
	if (revs.rpm.length < 10)
		throw new RecordingError(
			`Only ${revs.rpm.length} revolutions were found on “${sp.name}”: a sweep needs many more. Check the channel and the pulses per revolution.`
		);
	const result = analyzeSweep(resp.samples, r.sampleRateHz, revs, choice.orders);
	if (result.pieces.length === 0)
		throw new RecordingError(
			`The speed stays between ${Math.round(result.minRpm)} and ${Math.round(result.maxRpm)} rpm: this is not a run-up or coast-down (the speed must change by more than 5 % of its range and 20 rpm).`
		);
	return {
		result,
		unit: resp.unit,
		responseName: resp.name,
		tach: {
			source: choice.speed.kind,
			polarity: revs.polarity,
			revolutions: revs.rpm.length,
			pulses: revs.pulseS.length,
			missing: revs.repairs.missing,
			extra: revs.repairs.extra,
			guarded: revs.repairs.guarded,
			gaps: revs.repairs.gaps
		}
	};
}
