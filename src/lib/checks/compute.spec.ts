import { describe, expect, it } from 'vitest';
import { computeCheck, type AssetForCheck } from './compute.ts';

// a 4-pole direct-drive fan on a drive, 600–1,800 rpm, with 2× line taken from the drive
const fan = (slipPct: number | null): AssetForCheck => ({
	minRpm: 600,
	maxRpm: 1800,
	motorPoles: 4,
	slipPct,
	driveRatio: 1,
	skipBands: 3,
	sources: [
		{ id: 's', kind: 'shaft', label: '', params: { orders: [1] } },
		{
			id: 'l',
			kind: 'line',
			label: '',
			params: { lineFrequencyHz: 60, drive: { poles: 4, motorRpmPerShaftRpm: 1 } }
		}
	]
});

describe('a check on a drive with the motor’s slip', () => {
	it('carries the asset’s slip into drive Hz and 2× line (motor nameplate arithmetic, common practice)', () => {
		const modes = [{ frequencyHz: 24, dampingRatio: null }];
		const without = computeCheck(fan(null), null, 1500, modes);
		const withSlip = computeCheck(fan(2), null, 1500, modes);
		// drive Hz = p · n / (120 (1 − s)): 2 % slip raises every band edge by 1/0.98
		const [a] = without.bands.bands;
		const [b] = withSlip.bands.bands;
		expect(b.lowRpm).toBeCloseTo(a.lowRpm, 9);
		expect(b.driveLowHz as number).toBeCloseTo((a.driveLowHz as number) / 0.98, 9);
		expect(withSlip.bands.slipNote).toMatch(/slip of 2 %/);
		// 2× line of the drive at 1,500 rpm: 2 · 1500 · 4 / 120 = 100 Hz synchronous, /0.98 with slip
		const line = (c: typeof without) =>
			c.result.lines.find((l) => l.kind === 'line' && l.order !== null)!;
		expect(((line(without).order as number) * 1500) / 60).toBeCloseTo(100, 9);
		expect(((line(withSlip).order as number) * 1500) / 60).toBeCloseTo(100 / 0.98, 9);
	});
});
