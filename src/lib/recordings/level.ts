/**
 * The overall vibration level of a record of the machine running (the background file of a bump
 * test is one): band-limited r.m.s. velocity in mm/s, integrated from acceleration in the
 * frequency domain where the channel is acceleration. Only calibrated units give a level.
 */
import {
	severityBand,
	velocityRmsFromAcceleration,
	velocityRmsFromVelocity
} from '../vibration/severity.ts';
import { STANDARD_GRAVITY } from '../vibration/units.ts';
import type { Channel } from './types.ts';

export type LevelResult =
	| {
			ok: true;
			velocityMmS: number;
			band: { lowHz: number; highHz: number };
			from: 'acceleration' | 'velocity';
			/** what limits the figure (a band cut short by the sample rate, a short record) */
			notes: string[];
	  }
	| { ok: false; message: string };

/** SI factor of a channel unit: acceleration to m/s², velocity to m/s; null when not calibrated. */
export function unitFactor(
	unit: string
): { kind: 'acceleration' | 'velocity'; toSi: number } | null {
	const u = unit.trim().toLowerCase().replace('^2', '²').replace(/s2$/, 's²');
	if (u === 'g') return { kind: 'acceleration', toSi: STANDARD_GRAVITY };
	if (u === 'm/s²') return { kind: 'acceleration', toSi: 1 };
	if (u === 'mm/s²') return { kind: 'acceleration', toSi: 1e-3 };
	if (u === 'mm/s') return { kind: 'velocity', toSi: 1e-3 };
	if (u === 'm/s') return { kind: 'velocity', toSi: 1 };
	if (u === 'in/s' || u === 'ips' || u === 'in/sec') return { kind: 'velocity', toSi: 0.0254 };
	return null;
}

export function overallLevel(
	channel: Channel,
	sampleRateHz: number,
	rpm: number | null
): LevelResult {
	const unit = unitFactor(channel.unit);
	if (!unit)
		return {
			ok: false,
			message: `No overall level: the channel “${channel.name}” is in “${channel.unit || 'no unit'}”, not a calibrated acceleration (g, m/s²) or velocity (mm/s, in/s).`
		};
	const standard = severityBand(rpm ?? 1000);
	const notes: string[] = [];
	const nyquist = sampleRateHz / 2;
	const band = { lowHz: standard.lowHz, highHz: Math.min(standard.highHz, 0.9 * nyquist) };
	if (band.highHz < standard.highHz)
		notes.push(
			`The record’s sample rate reaches only ${band.highHz.toFixed(0)} Hz of the ${standard.highHz} Hz band: the level may read low.`
		);
	const seconds = channel.samples.length / sampleRateHz;
	if (seconds < 10 / band.lowHz)
		notes.push(
			`The record is ${seconds.toFixed(1)} s long; ${(10 / band.lowHz).toFixed(0)} s or more gives a steadier level down to ${band.lowHz} Hz.`
		);
	if (band.highHz <= band.lowHz)
		return { ok: false, message: 'No overall level: the sample rate is too low for the band.' };
	const si = channel.samples.map((x) => x * unit.toSi);
	const velocityMmS =
		unit.kind === 'acceleration'
			? velocityRmsFromAcceleration(si, sampleRateHz, band)
			: velocityRmsFromVelocity(si, sampleRateHz, band);
	return { ok: true, velocityMmS, band, from: unit.kind, notes };
}
