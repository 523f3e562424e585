/**
 * The sensors a tablet records bump tests with, and how a sample of the audio input (a number in
 * −1…1 of the interface's full scale) becomes a physical value. Pure arithmetic, shared by the
 * capture screen, the capture worker and the WAV metadata the server reads back.
 *
 * Two ways to state a sensitivity, as the paperwork gives them:
 * - `mV`: the sensor's sensitivity in mV per unit (its calibration sheet) and the interface's
 *   full-scale input in volts peak (its data sheet): one unit reads mV/1000 ÷ V of full scale;
 * - `counts`: counts per unit directly (an interface calibrated as a whole), with the converter's
 *   bits: full scale is 2^(bits−1) counts.
 */
import { z } from 'zod';

export const SENSOR_KINDS = ['accelerometer', 'microphone'] as const;
export type SensorKind = (typeof SENSOR_KINDS)[number];

/** What one unit of a sensor's output is: g for an accelerometer, pascal for a microphone. */
export const unitOf = (kind: SensorKind) => (kind === 'accelerometer' ? 'g' : 'Pa');

const positive = (what: string, max: number) =>
	z
		.number({ error: `${what} must be a number` })
		.finite(`${what} must be a number`)
		.positive(`${what} must be greater than zero`)
		.max(max, `${what} must be at most ${max}`);

export const sensitivitySchema = z.discriminatedUnion('mode', [
	z.object({
		mode: z.literal('mV'),
		/** mV per g (accelerometer) or mV per Pa (microphone) */
		mvPerUnit: positive('Sensitivity (mV per unit)', 100_000),
		/** the interface's input that reads full scale, volts peak */
		fullScaleV: positive('Full-scale input (V)', 100)
	}),
	z.object({
		mode: z.literal('counts'),
		countsPerUnit: positive('Counts per unit', 1e12),
		bits: z.union([z.literal(16), z.literal(24), z.literal(32)], {
			error: 'Converter bits must be 16, 24 or 32'
		})
	})
]);
export type Sensitivity = z.infer<typeof sensitivitySchema>;

export const sensorSchema = z
	.object({
		id: z.string().min(1).max(64),
		name: z
			.string()
			.trim()
			.min(1, 'Give the sensor a name (for example its serial number)')
			.max(80, 'A sensor name is at most 80 characters'),
		kind: z.enum(SENSOR_KINDS),
		sensitivity: sensitivitySchema,
		/** when the sensitivity was last set from a calibration on this tablet (ms since 1970) */
		calibratedAt: z.number().int().nonnegative().nullable()
	})
	.strict();
export type Sensor = z.infer<typeof sensorSchema>;

/** Full-scale units (the input's ±1) per one unit of the sensor: g or Pa. */
export function fullScalePerUnit(s: Sensitivity): number {
	return s.mode === 'mV' ? s.mvPerUnit / 1000 / s.fullScaleV : s.countsPerUnit / 2 ** (s.bits - 1);
}

/** The largest value the input can show before it clips, in the sensor's unit. */
export const rangeOf = (s: Sensitivity) => 1 / fullScalePerUnit(s);

/**
 * The reference a handheld calibrator gives: 1 g r.m.s. at 159.2 Hz (ω = 1000 rad/s) for an
 * accelerometer, 1 Pa r.m.s. (94 dB SPL) at 1 kHz for a microphone: both common practice; a
 * calibrator's certificate states its own level, which the technician may type instead.
 */
export const CALIBRATION_REFERENCE: Record<SensorKind, { level: number; frequencyHz: number }> = {
	accelerometer: { level: 1, frequencyHz: 159.2 },
	microphone: { level: 1, frequencyHz: 1000 }
};

/**
 * The sensitivity a calibration gives: the input read `measuredRms` (full-scale units r.m.s.) on a
 * reference of `referenceRms` units r.m.s.; expressed the way the sensor's current sensitivity is
 * (mV per unit with the same full-scale volts, or counts per unit with the same bits).
 */
export function calibratedSensitivity(
	measuredRms: number,
	referenceRms: number,
	like: Sensitivity
): Sensitivity {
	if (!(measuredRms > 0) || !Number.isFinite(measuredRms))
		throw new RangeError('The input read nothing at the reference frequency: check the cable.');
	if (!(referenceRms > 0) || !Number.isFinite(referenceRms))
		throw new RangeError('The reference level must be greater than zero.');
	const perUnit = measuredRms / referenceRms; // full-scale units per g (or Pa)
	return like.mode === 'mV'
		? { mode: 'mV', mvPerUnit: perUnit * like.fullScaleV * 1000, fullScaleV: like.fullScaleV }
		: { mode: 'counts', countsPerUnit: perUnit * 2 ** (like.bits - 1), bits: like.bits };
}

/** "100 mV/g into ±2 V" or "419 430 counts/g (24-bit)", for lists, WAV metadata and reports. */
export function describeSensitivity(s: Sensitivity, kind: SensorKind): string {
	const u = unitOf(kind);
	return s.mode === 'mV'
		? `${round(s.mvPerUnit)} mV/${u} into ±${round(s.fullScaleV)} V`
		: `${round(s.countsPerUnit)} counts/${u} (${s.bits}-bit)`;
}

const round = (v: number) => Number(v.toPrecision(4)).toString();

/** A new sensor as the form starts it: an accelerometer of 100 mV/g into ±1 V (common practice). */
export function blankSensor(id: string): Sensor {
	return {
		id,
		name: '',
		kind: 'accelerometer',
		sensitivity: { mode: 'mV', mvPerUnit: 100, fullScaleV: 1 },
		calibratedAt: null
	};
}
