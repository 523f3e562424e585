/** One check as a tablet pushes it (see DEVELOPERS.md, "Sync API"), for the benchmarks and tests. */
export interface ItemOptions {
	id?: string;
	checkedAt?: number;
	notes?: string;
	/** natural frequencies, Hz, with their damping ratio (null: not measured) */
	modes?: { hz: number; zeta: number | null; direction?: 'horizontal' | 'vertical' | 'axial' }[];
}

export function checkItem(assetId: string, measuredRpm: number, o: ItemOptions = {}) {
	return {
		id: o.id ?? crypto.randomUUID(),
		assetId,
		checkedAt: o.checkedAt ?? Date.now(),
		measuredRpm,
		driveSetpointHz: null,
		notes: o.notes ?? '',
		replacesCheckId: null,
		modes: (o.modes ?? [{ hz: 30, zeta: 0.03 }]).map((m) => ({
			frequencyHz: m.hz,
			dampingRatio: m.zeta,
			direction: m.direction ?? 'horizontal',
			location: null,
			origin: 'typed'
		})),
		// a made-up device summary: the server recomputes and keeps its own
		device: {
			verdict: 'clear',
			verdictAtSpeed: 'clear',
			worstMarginAtSpeedPct: null,
			worstMarginOverRangePct: null
		}
	};
}
