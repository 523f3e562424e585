/**
 * The excitation catalogue of an asset: every forcing frequency its components make, each either
 * proportional to the reference shaft speed (an "order") or fixed. Formulas: ../shared/domain.md
 * sections 4 and 5 (shaft orders, vane/blade pass, gear mesh, bearing defect frequencies, belt
 * pass, twice line frequency).
 */
import {
	evenPoles,
	slipFraction,
	finite,
	integerAtLeast,
	nonEmpty,
	object,
	positive,
	within,
	VibrationInputError,
	nonNegative
} from './errors.ts';

export const EXCITATION_KINDS = [
	'shaft',
	'vane',
	'blade',
	'gear',
	'bearing',
	'belt',
	'line',
	'fixed'
] as const;
export type ExcitationKind = (typeof EXCITATION_KINDS)[number];

/** Fields every source has. `speedRatio` is the speed of the component's shaft ÷ the reference shaft's (default 1). */
interface SourceBase {
	id: string;
	label?: string;
	speedRatio?: number;
}

export type ExcitationSource =
	| (SourceBase & { kind: 'shaft'; orders: number[] })
	| (SourceBase & { kind: 'vane' | 'blade'; count: number; harmonics?: number[] })
	| (SourceBase & { kind: 'gear'; teeth: number; matingTeeth: number; harmonics?: number[] })
	| (SourceBase & {
			kind: 'bearing';
			rollingElements: number;
			elementDiameter: number;
			pitchDiameter: number;
			contactAngleDeg: number;
	  })
	| (SourceBase & {
			kind: 'belt';
			sheaveDiameter: number;
			beltLength: number;
			harmonics?: number[];
	  })
	| (SourceBase & {
			kind: 'line';
			lineFrequencyHz: number;
			/** on a drive: motor poles (even), motor rpm per shaft rpm, and the slip as a fraction */
			drive?: { poles: number; motorRpmPerShaftRpm: number; slip?: number | null } | null;
	  })
	| (SourceBase & { kind: 'fixed'; frequencyHz: number });

/** One forcing frequency. Exactly one of `order` (× reference shaft frequency) and `fixedHz` is set. */
export interface ExcitationLine {
	id: string;
	sourceId: string;
	kind: ExcitationKind;
	label: string;
	order: number | null;
	fixedHz: number | null;
}

export interface BearingGeometry {
	rollingElements: number;
	/** rolling-element diameter d (any length unit, same as pitchDiameter) */
	elementDiameter: number;
	/** pitch diameter D */
	pitchDiameter: number;
	/** contact angle φ in degrees (0 for deep-groove and cylindrical bearings) */
	contactAngleDeg: number;
}

export interface BearingFrequencies {
	ftf: number;
	bsf: number;
	bpfo: number;
	bpfi: number;
}

/**
 * Rolling-bearing defect frequencies, inner race turning, outer fixed, r = (d/D)·cos φ:
 * FTF = f/2·(1 − r), BPFO = n/2·f·(1 − r), BPFI = n/2·f·(1 + r), BSF = D/(2d)·f·(1 − r²).
 * Source: Harris & Kotzalas, Rolling Bearing Analysis; Randall, Vibration-based Condition
 * Monitoring §2 (../shared/domain.md section 4). Units follow shaftHz (Hz in, Hz out).
 */
export function bearingDefectFrequencies(
	geometry: BearingGeometry,
	shaftHz: number
): BearingFrequencies {
	const g = object('bearing geometry', geometry);
	const n = integerAtLeast('rollingElements', g.rollingElements, 3);
	const d = positive('elementDiameter', g.elementDiameter);
	const D = positive('pitchDiameter', g.pitchDiameter);
	const phi = within('contactAngleDeg', g.contactAngleDeg, 0, 89.9);
	const f = nonNegative('shaftHz', shaftHz);
	if (d >= D)
		throw new VibrationInputError('elementDiameter', `smaller than the pitch diameter ${D}`, d);
	const r = (d / D) * Math.cos((phi * Math.PI) / 180);
	return {
		ftf: (f / 2) * (1 - r),
		bpfo: (n / 2) * f * (1 - r),
		bpfi: (n / 2) * f * (1 + r),
		bsf: (D / (2 * d)) * f * (1 - r * r)
	};
}

const isPositive = (v: unknown): v is number => typeof v === 'number' && v > 0 && v < Infinity;

function harmonicsOf(name: string, list: number[] | undefined, fallback: number[]): number[] {
	const h = list ?? fallback;
	nonEmpty(name, h);
	// validate without building a message unless something is wrong (this runs for every asset of a fleet)
	for (let i = 0; i < h.length; i++) if (!isPositive(h[i])) positive(`${name}[${i}]`, h[i]);
	return h;
}

const TIMES_CACHE = new Map<number, string>();
function times(h: number): string {
	if (Number.isInteger(h)) return `${h}×`;
	let t = TIMES_CACHE.get(h);
	if (t === undefined) {
		t = `${Number.isInteger(h) ? h : +h.toFixed(3)}×`;
		if (TIMES_CACHE.size < 10_000) TIMES_CACHE.set(h, t);
	}
	return t;
}

/**
 * Expands a source into its lines. Vane/blade pass: count × f and 2× (domain.md §5). Gear mesh:
 * teeth × f, harmonics 1–3×, plus 1× and 2× of the mating shaft, which turns at f·teeth/matingTeeth.
 * Belt pass: π·D_sheave·N/(60·L_belt) (one turn of the belt), 1× and 2×. Twice line frequency:
 * fixed 2·f_line on a mains-fed motor; on a drive it follows the output, 2·(motor rpm·p/120) Hz.
 */
export function excitationLines(source: ExcitationSource): ExcitationLine[] {
	const s = object('excitation source', source);
	if (typeof s.id !== 'string' || s.id.length === 0)
		throw new VibrationInputError('source id', 'a non-empty string', s.id);
	const ratio =
		s.speedRatio === undefined
			? 1
			: isPositive(s.speedRatio)
				? s.speedRatio
				: positive(`speedRatio of ${s.id}`, s.speedRatio);
	const orderLine = (tag: string, label: string, order: number): ExcitationLine => ({
		id: `${s.id}:${tag}`,
		sourceId: s.id,
		kind: s.kind,
		label: s.label ? `${s.label} ${label}` : label,
		order,
		fixedHz: null
	});
	switch (s.kind) {
		case 'shaft': {
			const orders = harmonicsOf('orders', s.orders, [1]);
			const suffix = ratio === 1 ? 'shaft' : `shaft (${+ratio.toFixed(4)}:1)`;
			return orders.map((o) => orderLine(times(o), `${times(o)} ${suffix}`, o * ratio));
		}
		case 'vane':
		case 'blade': {
			const count = integerAtLeast(`${s.kind} count`, s.count, 1);
			const name = s.kind === 'vane' ? 'Vane pass' : 'Blade pass';
			return harmonicsOf('harmonics', s.harmonics, [1, 2]).map((h) =>
				orderLine(times(h), `${name} ${times(h)}`, h * count * ratio)
			);
		}
		case 'gear': {
			const z1 = integerAtLeast('teeth', s.teeth, 1);
			const z2 = integerAtLeast('matingTeeth', s.matingTeeth, 1);
			const mesh = harmonicsOf('harmonics', s.harmonics, [1, 2, 3]).map((h) =>
				orderLine(`gmf${times(h)}`, `Gear mesh ${times(h)}`, h * z1 * ratio)
			);
			const other = (ratio * z1) / z2;
			return [
				...mesh,
				orderLine('mate1×', `Mating shaft 1×`, other),
				orderLine('mate2×', `Mating shaft 2×`, 2 * other)
			];
		}
		case 'bearing': {
			const per = bearingDefectFrequencies(s, 1); // multiples of the bearing shaft's frequency
			return [
				orderLine('ftf', 'FTF', per.ftf * ratio),
				orderLine('bsf', 'BSF', per.bsf * ratio),
				orderLine('2bsf', '2×BSF', 2 * per.bsf * ratio),
				orderLine('bpfo', 'BPFO', per.bpfo * ratio),
				orderLine('bpfi', 'BPFI', per.bpfi * ratio)
			];
		}
		case 'belt': {
			const D = positive('sheaveDiameter', s.sheaveDiameter);
			const L = positive('beltLength', s.beltLength);
			if (Math.PI * D >= L)
				throw new VibrationInputError(
					'beltLength',
					`longer than the sheave's circumference ${+(Math.PI * D).toFixed(4)}`,
					L
				);
			const per = (Math.PI * D) / L; // belt turns per sheave revolution
			return harmonicsOf('harmonics', s.harmonics, [1, 2]).map((h) =>
				orderLine(`belt${times(h)}`, `Belt pass ${times(h)}`, h * per * ratio)
			);
		}
		case 'line': {
			const fl = positive('lineFrequencyHz', s.lineFrequencyHz);
			if (s.drive) {
				const p = evenPoles(s.drive.poles);
				const mr = positive('motorRpmPerShaftRpm', s.drive.motorRpmPerShaftRpm);
				const slip =
					s.drive.slip === null || s.drive.slip === undefined ? 0 : slipFraction(s.drive.slip);
				// 2 × the drive's output frequency; output Hz = motor rpm · p / (120 (1 − s)), so per
				// shaft Hz (60 shaft rpm): 2 · mr · p / (2 (1 − s)) = mr · p / (1 − s)
				return [orderLine('2line', '2× line (drive)', (mr * p) / (1 - slip))];
			}
			return [
				{
					id: `${s.id}:2line`,
					sourceId: s.id,
					kind: 'line',
					label: s.label ? `${s.label} 2× line` : '2× line',
					order: null,
					fixedHz: 2 * fl
				}
			];
		}
		case 'fixed': {
			const f = positive('frequencyHz', s.frequencyHz);
			return [
				{
					id: `${s.id}:fixed`,
					sourceId: s.id,
					kind: 'fixed',
					label: s.label ?? `Fixed ${+f.toFixed(3)} Hz`,
					order: null,
					fixedHz: f
				}
			];
		}
		default:
			throw new VibrationInputError(
				'excitation kind',
				`one of ${EXCITATION_KINDS.join(', ')}`,
				(s as { kind: unknown }).kind
			);
	}
}

/** All lines of an asset's sources. */
export function excitationCatalogue(sources: readonly ExcitationSource[]): ExcitationLine[] {
	if (!Array.isArray(sources)) throw new VibrationInputError('sources', 'a list', sources);
	const out: ExcitationLine[] = [];
	for (const s of sources) for (const line of excitationLines(s)) out.push(line);
	return out;
}

/** The line's frequency at reference shaft speed `rpm`, Hz. */
export function lineFrequencyHz(line: ExcitationLine, rpm: number): number {
	if (line.fixedHz !== null) return line.fixedHz;
	return (line.order as number) * (nonNegative('speed (rpm)', rpm) / 60);
}

/** The band [lo, hi] Hz the line sweeps over the speed range; lo = hi for a fixed line. */
export function lineBandHz(line: ExcitationLine, minRpm: number, maxRpm: number): [number, number] {
	const lo = finite('minRpm', minRpm);
	const hi = finite('maxRpm', maxRpm);
	if (lo < 0 || hi < lo)
		throw new VibrationInputError('speed range', `0 ≤ min ≤ max rpm`, [lo, hi]);
	if (line.fixedHz !== null) return [line.fixedHz, line.fixedHz];
	return [((line.order as number) * lo) / 60, ((line.order as number) * hi) / 60];
}
