/**
 * How long each hit's record should be, from what the asset's last check found (its lowest natural
 * frequency and that mode's damping) or, without one, from the lowest running speed: at least six
 * time constants τ = 1/(ζω) of the decay (Trethewey & Cafeo, ../shared/domain.md §6.1), rounded up
 * to a length the screen offers.
 */
export const RECORD_LENGTHS_S = [0.5, 1, 2, 3, 4, 6, 8, 12, 16] as const;
/** damping assumed when none is known: 2 % (common practice for steel structures, from memory) */
export const ASSUMED_ZETA = 0.02;

export interface RecordLengthAdvice {
	seconds: (typeof RECORD_LENGTHS_S)[number];
	reason: string;
}

export function suggestRecordLength(asset: {
	minRpm: number;
	lastCheck: { modes: { frequencyHz: number; dampingRatio: number | null }[] } | null;
}): RecordLengthAdvice {
	const modes = asset.lastCheck?.modes ?? [];
	const lowest = modes.reduce<(typeof modes)[number] | null>(
		(a, m) => (a === null || m.frequencyHz < a.frequencyHz ? m : a),
		null
	);
	// without a measured mode, the lowest frequency that matters: 1× at the lowest speed, less a
	// 20 % margin (common practice)
	const f = lowest ? lowest.frequencyHz : (0.8 * asset.minRpm) / 60;
	const zeta = lowest?.dampingRatio ?? ASSUMED_ZETA;
	const need = 6 / (zeta * 2 * Math.PI * f);
	const seconds = RECORD_LENGTHS_S.find((s) => s >= need) ?? RECORD_LENGTHS_S.at(-1)!;
	const what = lowest
		? `the lowest natural frequency of the last check, ${f.toFixed(1)} Hz`
		: `0.8 × the lowest speed, ${f.toFixed(1)} Hz`;
	return {
		seconds,
		reason: `Six decay time constants of ${what} at ζ ${zeta.toFixed(3)}${lowest?.dampingRatio ? '' : ' (assumed)'}: ${need.toFixed(1)} s.`
	};
}
