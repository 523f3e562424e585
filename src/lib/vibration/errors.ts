/**
 * The one error type the engine throws. Every function validates its inputs at the door and
 * throws this instead of returning NaN or Infinity, so a bad reading never turns into a verdict.
 */
export class VibrationInputError extends Error {
	readonly parameter: string;
	readonly rule: string;
	readonly value: unknown;

	constructor(parameter: string, rule: string, value: unknown) {
		super(`${parameter} must be ${rule} (got ${describe(value)})`);
		this.name = 'VibrationInputError';
		this.parameter = parameter;
		this.rule = rule;
		this.value = value;
	}
}

function describe(value: unknown): string {
	if (typeof value === 'number') return Number.isNaN(value) ? 'NaN' : String(value);
	if (value === undefined) return 'nothing';
	if (value === null) return 'null';
	if (Array.isArray(value)) return `a list of ${value.length}`;
	if (typeof value === 'string')
		return JSON.stringify(value.length > 40 ? value.slice(0, 40) + '…' : value);
	return typeof value;
}

/** A finite number (not NaN, not ±Infinity). */
export function finite(name: string, value: unknown): number {
	if (typeof value !== 'number' || !Number.isFinite(value)) {
		throw new VibrationInputError(name, 'a finite number', value);
	}
	return value;
}

/** A finite number strictly greater than zero. */
export function positive(name: string, value: unknown): number {
	const v = finite(name, value);
	if (v <= 0) throw new VibrationInputError(name, 'greater than zero', value);
	return v;
}

/** A finite number greater than or equal to zero. */
export function nonNegative(name: string, value: unknown): number {
	const v = finite(name, value);
	if (v < 0) throw new VibrationInputError(name, 'zero or more', value);
	return v;
}

/** A finite number of at least `min` (for physical floors such as a shaft speed of 0.001 rpm). */
export function atLeast(name: string, value: unknown, min: number, unit = ''): number {
	const v = finite(name, value);
	if (v < min)
		throw new VibrationInputError(name, `at least ${min}${unit ? ' ' + unit : ''}`, value);
	return v;
}

/** A whole number greater than or equal to `min`. */
export function integerAtLeast(name: string, value: unknown, min: number): number {
	const v = finite(name, value);
	if (!Number.isInteger(v) || v < min)
		throw new VibrationInputError(name, `a whole number of at least ${min}`, value);
	return v;
}

/** An induction motor's pole count: a whole, even number of at least 2 (poles come in pairs). */
export function evenPoles(value: unknown): number {
	const v = integerAtLeast('motor poles', value, 2);
	if (v % 2 !== 0)
		throw new VibrationInputError('motor poles', 'an even number (poles come in pairs)', value);
	return v;
}

/** A slip as a fraction: at least 0 and below 0.2 (a running induction motor slips 0.5–5 %). */
export function slipFraction(value: unknown): number {
	const v = finite('slip', value);
	if (v < 0 || v >= 0.2)
		throw new VibrationInputError('slip', 'from 0 to below 0.2 (0–20 %)', value);
	return v;
}

/** A finite number in the closed interval [lo, hi]. */
export function within(name: string, value: unknown, lo: number, hi: number): number {
	const v = finite(name, value);
	if (v < lo || v > hi) throw new VibrationInputError(name, `between ${lo} and ${hi}`, value);
	return v;
}

/** A non-empty array. */
export function nonEmpty<T>(name: string, value: readonly T[] | null | undefined): readonly T[] {
	if (!Array.isArray(value) || value.length === 0)
		throw new VibrationInputError(name, 'a non-empty list', value);
	return value;
}

/** An object (not null, not an array). */
export function object<T extends object>(name: string, value: T | null | undefined): T {
	if (typeof value !== 'object' || value === null || Array.isArray(value)) {
		throw new VibrationInputError(name, 'an object', value);
	}
	return value;
}

/** One of the allowed string values. */
export function oneOf<T extends string>(name: string, value: unknown, allowed: readonly T[]): T {
	if (typeof value !== 'string' || !(allowed as readonly string[]).includes(value)) {
		throw new VibrationInputError(name, `one of ${allowed.join(', ')}`, value);
	}
	return value as T;
}
