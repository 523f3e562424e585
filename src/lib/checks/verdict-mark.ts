/**
 * Detune's verdict mark: one shape and one fill per verdict, so that a verdict reads without
 * colour (glare, greyscale print, colour-blind readers) — and the word always beside it.
 * - clear: a ring with a solid core (at rest, centred)
 * - tight: a diamond, half solid and half hatched (edging towards trouble)
 * - conflict: a solid square crossed through (a resonance crossing)
 * - unchecked: a dashed, empty ring (nothing measured)
 * The geometry is drawn on a 24 × 24 grid by the Svelte mark and by the PDF reports alike.
 */
export type MarkVerdict = 'clear' | 'tight' | 'conflict' | 'unchecked';

export interface MarkShape {
	/** SVG path data on the 24 × 24 grid */
	d: string;
	fill: 'solid' | 'none' | 'hatch' | 'knockout';
	/** stroke width in grid units (0: none) */
	stroke: number;
	dash?: [number, number];
}

const ring = 'M12 2.5a9.5 9.5 0 1 0 0 19a9.5 9.5 0 1 0 0-19Z';

export const VERDICT_MARKS: Record<MarkVerdict, MarkShape[]> = {
	clear: [
		{ d: ring, fill: 'none', stroke: 2.5 },
		{ d: 'M12 7a5 5 0 1 0 0 10a5 5 0 1 0 0-10Z', fill: 'solid', stroke: 0 }
	],
	tight: [
		{ d: 'M12 1.5L22.5 12L12 22.5L1.5 12Z', fill: 'none', stroke: 2.5 },
		{ d: 'M12 1.5L12 22.5L1.5 12Z', fill: 'solid', stroke: 0 },
		{ d: 'M12 1.5L22.5 12L12 22.5Z', fill: 'hatch', stroke: 0 }
	],
	conflict: [
		{ d: 'M2.5 2.5H21.5V21.5H2.5Z', fill: 'solid', stroke: 0 },
		{ d: 'M7 7L17 17M17 7L7 17', fill: 'knockout', stroke: 3 }
	],
	unchecked: [{ d: ring, fill: 'none', stroke: 2, dash: [3, 2.2] }]
};

export const VERDICT_WORDS: Record<MarkVerdict, string> = {
	clear: 'clear',
	tight: 'tight',
	conflict: 'conflict',
	unchecked: 'unchecked'
};
