/**
 * How natural and forcing frequencies are shown to a person: in hertz or in cycles per minute
 * (CPM), as each user chooses in Your settings. Everything stored, synced and computed stays in Hz;
 * this module converts only at the edge (screens, reports, spreadsheets). 1 Hz = 60 CPM by
 * definition (one cycle per second is sixty per minute).
 *
 * The precision follows the reading, not the unit: a value written to 0.01 Hz is written to the
 * whole CPM (0.6 CPM), one written to 0.1 Hz to the whole CPM too, so a CPM table never claims
 * more than the Hz one. Under 60 CPM one decimal is kept, so slow structures do not round to 0.
 */
import { frequencyFromHz, frequencyToHz } from './vibration/units.ts';

export const FREQUENCY_UNITS = ['Hz', 'CPM'] as const;
export type FrequencyUnit = (typeof FREQUENCY_UNITS)[number];

export const DEFAULT_FREQUENCY_UNIT: FrequencyUnit = 'Hz';

/** A frequency in Hz in the reader's unit, as a number (the engine's conversion). */
export const inUnit = (hz: number, unit: FrequencyUnit): number => frequencyFromHz(hz, unit);

/** A finite number typed in the reader's unit, in Hz (the engine's conversion). */
export const toHz = (value: number, unit: FrequencyUnit): number => frequencyToHz(value, unit);

/** The number alone: "29.60" (Hz, two decimals) or "1776" (CPM). */
export function frequencyNumber(hz: number, unit: FrequencyUnit, hzDecimals = 2): string {
	if (unit === 'Hz') return hz.toFixed(hzDecimals);
	const cpm = inUnit(hz, unit);
	return Math.abs(cpm) < 60 ? cpm.toFixed(1) : cpm.toFixed(0);
}

/** With its unit: "29.60 Hz" or "1776 CPM". */
export const frequency = (hz: number, unit: FrequencyUnit, hzDecimals = 2): string =>
	`${frequencyNumber(hz, unit, hzDecimals)} ${unit}`;

/** A worst pair as the board and reports show it: "29.60 Hz × 2× running speed". */
export const pairLabel = (naturalHz: number, label: string, unit: FrequencyUnit): string =>
	`${frequency(naturalHz, unit)} × ${label}`;
