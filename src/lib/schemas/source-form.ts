/**
 * The fields of each excitation-source kind as forms show them (lengths in mm, or in inches for
 * US customary users; metres stored), and the conversion between a form and the stored params.
 */
import { sourceParams, type SourceKind } from './excitation.ts';
import { METRES_PER_INCH, type UnitSystem } from '../vibration/units.ts';
import type { FrequencyUnit } from '../frequency.ts';

export interface FieldSpec {
	key: string;
	label: string;
	unit?: string;
	/** 'list' is a comma-separated list of numbers */
	type: 'number' | 'integer' | 'list';
	/** stored value = shown value × scale */
	scale?: number;
	optional?: boolean;
	/** for the drive sub-object of a line source */
	group?: 'drive';
}

export const SOURCE_FIELDS: Record<SourceKind, FieldSpec[]> = {
	shaft: [
		{ key: 'orders', label: 'Orders', unit: '× shaft, e.g. 0.5, 1, 2', type: 'list' },
		{
			key: 'speedRatio',
			label: 'Speed ratio',
			unit: 'this shaft ÷ reference',
			type: 'number',
			optional: true
		}
	],
	vane: [
		{ key: 'count', label: 'Vanes', type: 'integer' },
		{ key: 'harmonics', label: 'Harmonics', unit: 'e.g. 1, 2', type: 'list', optional: true },
		{ key: 'speedRatio', label: 'Speed ratio', type: 'number', optional: true }
	],
	blade: [
		{ key: 'count', label: 'Blades', type: 'integer' },
		{ key: 'harmonics', label: 'Harmonics', unit: 'e.g. 1, 2', type: 'list', optional: true },
		{ key: 'speedRatio', label: 'Speed ratio', type: 'number', optional: true }
	],
	gear: [
		{ key: 'teeth', label: 'Teeth on this shaft', type: 'integer' },
		{ key: 'matingTeeth', label: 'Teeth on the mating gear', type: 'integer' },
		{
			key: 'harmonics',
			label: 'Mesh harmonics',
			unit: 'e.g. 1, 2, 3',
			type: 'list',
			optional: true
		},
		{ key: 'speedRatio', label: 'Speed ratio', type: 'number', optional: true }
	],
	bearing: [
		{ key: 'rollingElements', label: 'Rolling elements', type: 'integer' },
		{ key: 'elementDiameter', label: 'Element diameter', unit: 'mm', type: 'number', scale: 1e-3 },
		{ key: 'pitchDiameter', label: 'Pitch diameter', unit: 'mm', type: 'number', scale: 1e-3 },
		{ key: 'contactAngleDeg', label: 'Contact angle', unit: '°', type: 'number' },
		{ key: 'speedRatio', label: 'Speed ratio', type: 'number', optional: true }
	],
	belt: [
		{ key: 'sheaveDiameter', label: 'Sheave diameter', unit: 'mm', type: 'number', scale: 1e-3 },
		{ key: 'beltLength', label: 'Belt length', unit: 'mm', type: 'number', scale: 1e-3 },
		{ key: 'speedRatio', label: 'Sheave speed ratio', type: 'number', optional: true }
	],
	line: [
		{ key: 'lineFrequencyHz', label: 'Line frequency', unit: 'Hz', type: 'number' },
		{
			key: 'poles',
			label: 'Motor poles (on a drive)',
			type: 'integer',
			optional: true,
			group: 'drive'
		},
		{
			key: 'motorRpmPerShaftRpm',
			label: 'Motor rpm per shaft rpm',
			type: 'number',
			optional: true,
			group: 'drive'
		}
	],
	fixed: [{ key: 'frequencyHz', label: 'Frequency', unit: 'Hz', type: 'number' }]
};

/**
 * The fields of a kind in a unit system: lengths in mm (metric) or inches (US customary); a fixed
 * forcing frequency in the user's frequency unit (Hz or CPM). The line frequency stays in Hz: it is
 * the supply's, read off the nameplate.
 */
export function fieldsFor(
	kind: SourceKind,
	units: UnitSystem = 'metric',
	frequencyUnit: FrequencyUnit = 'Hz'
): FieldSpec[] {
	return SOURCE_FIELDS[kind].map((f) => {
		if (f.unit === 'mm' && units === 'us') return { ...f, unit: 'in', scale: METRES_PER_INCH };
		if (kind === 'fixed' && f.key === 'frequencyHz' && frequencyUnit === 'CPM')
			return { ...f, unit: 'CPM', scale: 1 / 60 };
		return f;
	});
}

const num = (s: string) => Number(s.replace(',', '.').trim());

/**
 * Form values (`p.<key>`) → validated params. Returns field errors keyed `p.<key>` on failure, so
 * the form shows them beside the right input.
 */
export function paramsFromForm(
	kind: SourceKind,
	form: Record<string, unknown>,
	units: UnitSystem = 'metric',
	frequencyUnit: FrequencyUnit = 'Hz'
): { ok: true; params: Record<string, unknown> } | { ok: false; errors: Record<string, string> } {
	const errors: Record<string, string> = {};
	const params: Record<string, unknown> = {};
	const drive: Record<string, unknown> = {};
	const fields = fieldsFor(kind, units, frequencyUnit);
	for (const f of fields) {
		const raw = String(form[`p.${f.key}`] ?? '').trim();
		if (raw === '') {
			if (!f.optional) errors[`p.${f.key}`] = `${f.label}: fill it in.`;
			continue;
		}
		let v: unknown;
		if (f.type === 'list') {
			const parts = raw
				.split(/[;,\s]+/)
				.filter(Boolean)
				.map(num);
			if (parts.some((p) => !Number.isFinite(p))) {
				errors[`p.${f.key}`] = `${f.label}: numbers separated by commas.`;
				continue;
			}
			v = parts;
		} else {
			const n = num(raw);
			if (!Number.isFinite(n)) {
				errors[`p.${f.key}`] = `${f.label}: a number.`;
				continue;
			}
			v = f.scale ? n * f.scale : n;
		}
		if (f.group === 'drive') drive[f.key] = v;
		else params[f.key] = v;
	}
	if (kind === 'line') {
		if (Object.keys(drive).length === 2) params.drive = drive;
		else if (Object.keys(drive).length === 1)
			errors['p.poles'] =
				'On a drive give both the motor poles and the motor/shaft ratio; off a drive leave both empty.';
		else params.drive = null;
	}
	if (Object.keys(errors).length) return { ok: false, errors };
	const parsed = sourceParams[kind].safeParse(params);
	if (!parsed.success) {
		for (const issue of parsed.error.issues) {
			const key = `p.${String(issue.path[issue.path.length - 1] ?? fields[0].key)}`;
			errors[key === 'p.drive' ? 'p.poles' : key] ??= issue.message;
		}
		return { ok: false, errors };
	}
	return { ok: true, params: parsed.data as Record<string, unknown> };
}

/** Stored params → the strings a form shows. */
export function formFromParams(
	kind: SourceKind,
	params: Record<string, unknown>,
	units: UnitSystem = 'metric',
	frequencyUnit: FrequencyUnit = 'Hz'
): Record<string, string> {
	const out: Record<string, string> = {};
	for (const f of fieldsFor(kind, units, frequencyUnit)) {
		const v =
			f.group === 'drive'
				? (params.drive as Record<string, unknown> | null | undefined)?.[f.key]
				: params[f.key];
		if (v === undefined || v === null) out[f.key] = '';
		else if (Array.isArray(v)) out[f.key] = v.join(', ');
		else out[f.key] = String(f.scale ? +(Number(v) / f.scale).toPrecision(10) : v);
	}
	return out;
}
