/**
 * The stored shape of an excitation source (kind + label + params JSON) and its conversion to the
 * engine's ExcitationSource. Lengths are SI metres; the forms convert at the edge.
 */
import { z } from 'zod';
import type { ExcitationSource } from '../vibration/index.ts';
import type { FrequencyUnit } from '../frequency.ts';

const pos = (what: string) =>
	z
		.number({ error: `${what} must be a number.` })
		.positive(`${what} must be greater than zero.`)
		.finite();
const count = (what: string) =>
	z
		.number({ error: `${what} must be a whole number.` })
		.int(`${what} must be a whole number.`)
		.min(1, `${what} must be at least 1.`)
		.max(10_000, `${what} is too large.`);
const harmonics = z.array(pos('Harmonic')).min(1, 'Give at least one harmonic.').max(10).optional();
const speedRatio = pos('Speed ratio').max(1000).optional();

export const sourceParams = {
	shaft: z
		.object({
			orders: z.array(pos('Order').max(100)).min(1, 'Give at least one order.').max(20),
			speedRatio
		})
		.strict(),
	vane: z.object({ count: count('Vane count'), harmonics, speedRatio }).strict(),
	blade: z.object({ count: count('Blade count'), harmonics, speedRatio }).strict(),
	gear: z
		.object({ teeth: count('Teeth'), matingTeeth: count('Mating teeth'), harmonics, speedRatio })
		.strict(),
	bearing: z
		.object({
			rollingElements: count('Rolling elements').min(
				3,
				'A bearing has at least 3 rolling elements.'
			),
			elementDiameter: pos('Element diameter'),
			pitchDiameter: pos('Pitch diameter'),
			contactAngleDeg: z
				.number()
				.min(0, 'Contact angle must be 0° or more.')
				.max(89, 'Contact angle must be below 90°.'),
			speedRatio
		})
		.strict()
		.refine((b) => b.elementDiameter < b.pitchDiameter, {
			message: 'Element diameter must be smaller than the pitch diameter.',
			path: ['elementDiameter']
		}),
	belt: z
		.object({
			sheaveDiameter: pos('Sheave diameter'),
			beltLength: pos('Belt length'),
			harmonics,
			speedRatio
		})
		.strict(),
	line: z
		.object({
			lineFrequencyHz: pos('Line frequency').max(1000),
			drive: z
				.object({
					poles: count('Poles')
						.min(2)
						.refine((p) => p % 2 === 0, 'Poles: an even number (poles come in pairs).'),
					motorRpmPerShaftRpm: pos('Motor/shaft ratio')
				})
				.strict()
				.nullable()
				.optional()
		})
		.strict(),
	fixed: z.object({ frequencyHz: pos('Frequency').max(100_000) }).strict()
} as const;

export type SourceKind = keyof typeof sourceParams;
export const SOURCE_KINDS = Object.keys(sourceParams) as SourceKind[];

/** The kind a new source is added as (the add form's choice). */
export const sourceKind = z.enum(SOURCE_KINDS as [SourceKind, ...SourceKind[]], {
	error: 'Choose the kind of source.'
});

export const SOURCE_KIND_LABELS: Record<SourceKind, string> = {
	shaft: 'Shaft orders',
	vane: 'Vane pass (pump)',
	blade: 'Blade pass (fan, blower)',
	gear: 'Gear mesh',
	bearing: 'Rolling bearing',
	belt: 'Belt pass',
	line: 'Twice line frequency',
	fixed: 'Fixed frequency'
};

const num = (v: unknown, digits = 3) =>
	typeof v === 'number' && Number.isFinite(v) ? String(Number(v.toPrecision(digits))) : '?';
const orderList = (v: unknown) => (Array.isArray(v) ? v.map((o) => `${num(o)}×`).join(', ') : '?');

/**
 * A source in words, with the same label as the screens: "Vane pass (pump): 5 vanes, up to 3×".
 * For reports and lists; an unreadable stored value prints as "?", never as code.
 */
export function describeSource(
	kind: string,
	label: string,
	params: unknown,
	frequencyUnit: FrequencyUnit = 'Hz'
): string {
	const p = (params ?? {}) as Record<string, unknown>;
	const name = SOURCE_KIND_LABELS[kind as SourceKind] ?? kind;
	const harm = typeof p.harmonics === 'number' && p.harmonics > 1 ? `, up to ${p.harmonics}×` : '';
	const ratio =
		typeof p.speedRatio === 'number' && p.speedRatio !== 1
			? `, at ${num(p.speedRatio)}× shaft speed`
			: '';
	const mm = (m: unknown) => (typeof m === 'number' ? `${num(m * 1000)} mm` : '?');
	let what: string;
	switch (kind) {
		case 'shaft':
			what = orderList(p.orders);
			break;
		case 'vane':
			what = `${num(p.count)} vanes${harm}`;
			break;
		case 'blade':
			what = `${num(p.count)} blades${harm}`;
			break;
		case 'gear':
			what = `${num(p.teeth)} teeth meshing with ${num(p.matingTeeth)}${harm}`;
			break;
		case 'bearing':
			what = `${num(p.rollingElements)} elements of ${mm(p.elementDiameter)} on a ${mm(p.pitchDiameter)} pitch circle, contact angle ${num(p.contactAngleDeg)}°`;
			break;
		case 'belt':
			what = `sheave ${mm(p.sheaveDiameter)}, belt ${mm(p.beltLength)} long${harm}`;
			break;
		case 'line': {
			const d = p.drive as { poles?: unknown } | null | undefined;
			what = `${num(p.lineFrequencyHz)} Hz line${d ? `, ${num(d.poles)}-pole motor on the drive` : ''}`;
			break;
		}
		case 'fixed':
			what =
				frequencyUnit === 'CPM' && typeof p.frequencyHz === 'number'
					? `${num(p.frequencyHz * 60, 6)} CPM`
					: `${num(p.frequencyHz, 6)} Hz`;
			break;
		default:
			what = '';
	}
	return `${name}${label ? ` “${label}”` : ''}: ${what}${ratio}`;
}

export interface StoredSource {
	id: string;
	kind: string;
	label: string;
	params: unknown;
}

/** Validates a stored source; returns the engine's shape or the first problem. */
export function parseSource(
	row: StoredSource
): { ok: true; source: ExcitationSource } | { ok: false; message: string } {
	const schema = (sourceParams as Record<string, z.ZodType>)[row.kind];
	if (!schema) return { ok: false, message: `Unknown excitation kind "${row.kind}".` };
	const parsed = schema.safeParse(row.params);
	if (!parsed.success)
		return { ok: false, message: parsed.error.issues[0]?.message ?? 'Invalid parameters.' };
	return {
		ok: true,
		source: {
			id: row.id,
			kind: row.kind,
			...(row.label ? { label: row.label } : {}),
			...(parsed.data as object)
		} as ExcitationSource
	};
}

/** Converts stored rows, throwing on the first bad one (stored rows were validated on write). */
export function toEngineSources(rows: readonly StoredSource[]): ExcitationSource[] {
	return rows.map((r) => {
		const p = parseSource(r);
		if (!p.ok) throw new Error(`Excitation source ${r.id}: ${p.message}`);
		return p.source;
	});
}
