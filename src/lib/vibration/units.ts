/**
 * Unit conversions, used only at the edges (forms, tables, reports). Everything inside the
 * engine is SI: Hz, rad/s, kg, N/m, N·s/m, m, s. Speeds are rpm everywhere.
 *
 * Exact definitions: 1 in = 0.0254 m and 1 lb = 0.45359237 kg (international yard and pound,
 * 1959); 1 lbf = 1 lb × 9.80665 m/s² (standard gravity, CGPM 1901).
 */
import { finite } from './errors.ts';

export const STANDARD_GRAVITY = 9.80665; // m/s²
export const METRES_PER_INCH = 0.0254;
export const KG_PER_POUND = 0.45359237;
export const NEWTONS_PER_POUND_FORCE = KG_PER_POUND * STANDARD_GRAVITY; // 4.4482216152605 N
export const NEWTONS_PER_METRE_PER_LBF_PER_INCH = NEWTONS_PER_POUND_FORCE / METRES_PER_INCH; // 175.1268 N/m

export type UnitSystem = 'metric' | 'us';
export type FrequencyUnit = 'Hz' | 'CPM' | 'rad/s';

export const hzToCpm = (hz: number): number => finite('frequency (Hz)', hz) * 60;
export const cpmToHz = (cpm: number): number => finite('frequency (CPM)', cpm) / 60;
export const hzToRadPerS = (hz: number): number => finite('frequency (Hz)', hz) * 2 * Math.PI;
export const radPerSToHz = (w: number): number =>
	finite('angular frequency (rad/s)', w) / (2 * Math.PI);
export const rpmToHz = (rpm: number): number => finite('speed (rpm)', rpm) / 60;
export const hzToRpm = (hz: number): number => finite('frequency (Hz)', hz) * 60;

export function frequencyToHz(value: number, unit: FrequencyUnit): number {
	if (unit === 'Hz') return finite('frequency (Hz)', value);
	if (unit === 'CPM') return cpmToHz(value);
	return radPerSToHz(value);
}

export function frequencyFromHz(hz: number, unit: FrequencyUnit): number {
	if (unit === 'Hz') return finite('frequency (Hz)', hz);
	if (unit === 'CPM') return hzToCpm(hz);
	return hzToRadPerS(hz);
}

export const mmToM = (mm: number): number => finite('length (mm)', mm) / 1000;
export const mToMm = (m: number): number => finite('length (m)', m) * 1000;
export const inToM = (inch: number): number => finite('length (in)', inch) * METRES_PER_INCH;
export const mToIn = (m: number): number => finite('length (m)', m) / METRES_PER_INCH;
export const lbToKg = (lb: number): number => finite('mass (lb)', lb) * KG_PER_POUND;
export const kgToLb = (kg: number): number => finite('mass (kg)', kg) / KG_PER_POUND;
export const lbfPerInToNPerM = (k: number): number =>
	finite('stiffness (lbf/in)', k) * NEWTONS_PER_METRE_PER_LBF_PER_INCH;
export const nPerMToLbfPerIn = (k: number): number =>
	finite('stiffness (N/m)', k) / NEWTONS_PER_METRE_PER_LBF_PER_INCH;
export const mmPerSToInPerS = (v: number): number => finite('velocity (mm/s)', v) / 25.4;
export const inPerSToMmPerS = (v: number): number => finite('velocity (in/s)', v) * 25.4;

/** Quantities the UI converts, with the display unit in each system and the factor to SI. */
export type Quantity =
	| 'length'
	| 'smallLength'
	| 'mass'
	| 'stiffness'
	| 'velocity'
	| 'modulus'
	| 'inertia'
	| 'torsionalStiffness'
	| 'secondMoment';

interface UnitDef {
	label: string;
	/** multiply a value in this unit by `toSi` to get SI */
	toSi: number;
}

const UNITS: Record<Quantity, Record<UnitSystem, UnitDef>> = {
	length: { metric: { label: 'm', toSi: 1 }, us: { label: 'in', toSi: METRES_PER_INCH } },
	smallLength: { metric: { label: 'mm', toSi: 1e-3 }, us: { label: 'in', toSi: METRES_PER_INCH } },
	mass: { metric: { label: 'kg', toSi: 1 }, us: { label: 'lb', toSi: KG_PER_POUND } },
	stiffness: {
		metric: { label: 'N/m', toSi: 1 },
		us: { label: 'lbf/in', toSi: NEWTONS_PER_METRE_PER_LBF_PER_INCH }
	},
	velocity: { metric: { label: 'mm/s', toSi: 1e-3 }, us: { label: 'in/s', toSi: METRES_PER_INCH } },
	modulus: {
		metric: { label: 'GPa', toSi: 1e9 },
		us: { label: 'psi', toSi: NEWTONS_PER_POUND_FORCE / (METRES_PER_INCH * METRES_PER_INCH) }
	},
	inertia: {
		metric: { label: 'kg·m²', toSi: 1 },
		us: { label: 'lb·in²', toSi: KG_PER_POUND * METRES_PER_INCH * METRES_PER_INCH }
	},
	torsionalStiffness: {
		metric: { label: 'N·m/rad', toSi: 1 },
		us: { label: 'lbf·in/rad', toSi: NEWTONS_PER_POUND_FORCE * METRES_PER_INCH }
	},
	secondMoment: {
		metric: { label: 'mm⁴', toSi: 1e-12 },
		us: { label: 'in⁴', toSi: METRES_PER_INCH ** 4 }
	}
};

/** The unit label shown beside an input of `quantity` in `system`. */
export function unitLabel(quantity: Quantity, system: UnitSystem): string {
	return UNITS[quantity][system].label;
}

/** Converts a displayed value to SI. */
export function toSi(value: number, quantity: Quantity, system: UnitSystem): number {
	return (
		finite(`${quantity} (${UNITS[quantity][system].label})`, value) * UNITS[quantity][system].toSi
	);
}

/** Converts an SI value to the displayed unit. */
export function fromSi(value: number, quantity: Quantity, system: UnitSystem): number {
	return finite(`${quantity} (SI)`, value) / UNITS[quantity][system].toSi;
}
