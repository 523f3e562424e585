import { describe, expect, it } from 'vitest';
// fast-check (registry): property-based tests of invariants that hold for every valid input.
import fc from 'fast-check';
import {
	avoidanceBands,
	bearingDefectFrequencies,
	comparePairs,
	evaluateCheck,
	excitationCatalogue,
	excitationLines,
	freeResponse,
	magnification,
	modeRemedies,
	oscillator,
	pairVerdictAtRpm,
	separationMarginPct,
	transmissibility,
	type CheckInput,
	type MarginRule
} from './index.ts';

const zeta = fc.double({ min: 1e-4, max: 5, noNaN: true });
const hz = fc.double({ min: 0.1, max: 5000, noNaN: true });

const rule: fc.Arbitrary<MarginRule> = fc.oneof(
	fc.record({
		kind: fc.constant('fixed' as const),
		percent: fc.double({ min: 0, max: 60, noNaN: true })
	}),
	fc.constant({ kind: 'amplification' as const })
);

const check: fc.Arbitrary<CheckInput> = fc
	.record({
		min: fc.double({ min: 0, max: 3000, noNaN: true }),
		span: fc.double({ min: 1, max: 3000, noNaN: true }),
		at: fc.double({ min: 0, max: 1, noNaN: true }),
		orders: fc.array(fc.double({ min: 0.25, max: 40, noNaN: true }), {
			minLength: 1,
			maxLength: 4
		}),
		fixed: fc.option(fc.double({ min: 1, max: 500, noNaN: true }), { nil: undefined }),
		modes: fc.array(
			fc.record({
				frequencyHz: hz,
				dampingRatio: fc.option(fc.double({ min: 0.001, max: 0.5, noNaN: true }), { nil: null })
			}),
			{ maxLength: 4 }
		),
		rule
	})
	.map(({ min, span, at, orders, fixed, modes, rule }) => ({
		speedRange: { minRpm: min, maxRpm: min + span },
		measuredRpm: Math.max(1, min + at * span),
		sources: [
			{ id: 's', kind: 'shaft' as const, orders },
			...(fixed === undefined ? [] : [{ id: 'f', kind: 'fixed' as const, frequencyHz: fixed }])
		],
		modes,
		rule
	}));

function allFinite(value: unknown): boolean {
	if (typeof value === 'number') return Number.isFinite(value);
	if (Array.isArray(value)) return value.every(allFinite);
	if (value && typeof value === 'object') return Object.values(value).every(allFinite);
	return true;
}

describe('invariants (fast-check)', () => {
	it('T(√2, ζ) = 1 for every ζ (domain.md F9 [S])', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 0, max: 10, noNaN: true }),
				(z) => Math.abs(transmissibility(Math.SQRT2, z) - 1) < 1e-12
			)
		);
		expect(transmissibility(Math.SQRT2, 0.3)).toBeCloseTo(1, 12);
	});

	it('DMF(1, ζ) = 1/(2ζ) for every ζ > 0 (domain.md F8 [S])', () => {
		fc.assert(fc.property(zeta, (z) => Math.abs(magnification(1, z) * 2 * z - 1) < 1e-12));
		expect(magnification(1, 0.05)).toBeCloseTo(10, 12);
	});

	it('BPFO + BPFI = n·f_r and BPFO = n·FTF for every geometry (domain.md §4 [S2])', () => {
		fc.assert(
			fc.property(
				fc.integer({ min: 3, max: 40 }),
				fc.double({ min: 1, max: 50, noNaN: true }),
				fc.double({ min: 0.01, max: 0.95, noNaN: true }),
				fc.double({ min: 0, max: 45, noNaN: true }),
				fc.double({ min: 0.1, max: 200, noNaN: true }),
				(n, d, ratio, phi, fr) => {
					const f = bearingDefectFrequencies(
						{
							rollingElements: n,
							elementDiameter: d,
							pitchDiameter: d / ratio,
							contactAngleDeg: phi
						},
						fr
					);
					return (
						Math.abs(f.bpfo + f.bpfi - n * fr) < 1e-9 * n * fr &&
						Math.abs(f.bpfo - n * f.ftf) < 1e-9 * n * fr
					);
				}
			)
		);
		expect(
			bearingDefectFrequencies(
				{ rollingElements: 8, elementDiameter: 10, pitchDiameter: 50, contactAngleDeg: 0 },
				30
			).bpfo
		).toBeCloseTo(96, 10);
	});

	it('margins do not depend on the unit (Hz or CPM) and |Δf| is symmetric between the two conventions', () => {
		fc.assert(
			fc.property(hz, hz, (a, b) => {
				const sm = separationMarginPct(a, b);
				const smCpm = separationMarginPct(a * 60, b * 60);
				return (
					Math.abs(sm - smCpm) <= 1e-9 * Math.max(1, sm) &&
					Math.abs(sm * b - separationMarginPct(b, a) * a) <= 1e-9 * Math.max(sm * b, 1)
				);
			})
		);
		expect(separationMarginPct(24, 29.6) * 29.6).toBeCloseTo(separationMarginPct(29.6, 24) * 24, 9);
	});

	it('every speed where a pair is short of its margin lies inside an avoidance band, and no clear speed does', () => {
		fc.assert(
			fc.property(
				check,
				fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: 5, maxLength: 5 }),
				(input, ts) => {
					const plan = avoidanceBands(input);
					const lines = excitationLines(input.sources[0]);
					for (const t of ts) {
						const rpm =
							input.speedRange.minRpm + t * (input.speedRange.maxRpm - input.speedRange.minRpm);
						if (rpm < 0.001) continue; // below the engine's floor for a speed
						const inBand = plan.bands.some((b) => rpm >= b.lowRpm && rpm <= b.highRpm);
						const nearEdge = plan.bands.some(
							(b) => Math.abs(rpm - b.lowRpm) < 1e-7 * rpm || Math.abs(rpm - b.highRpm) < 1e-7 * rpm
						);
						if (nearEdge) continue;
						const short = input.modes.some((m) =>
							lines.some(
								(line) =>
									pairVerdictAtRpm(
										m.frequencyHz,
										line,
										rpm,
										input.rule,
										m.dampingRatio ? 1 / (2 * m.dampingRatio) : null
									) !== 'clear'
							)
						);
						if (short !== inBand) return false;
					}
					return true;
				}
			),
			{ numRuns: 300 }
		);
		expect(true).toBe(true);
	});

	it('no function returns NaN or Infinity for a valid check', () => {
		fc.assert(
			fc.property(check, (input) => {
				const r = evaluateCheck(input);
				const bands = avoidanceBands(input, { poles: 4, motorRpmPerShaftRpm: 1.5 });
				const remedies = modeRemedies(input);
				return (
					allFinite(r.pairs) &&
					allFinite(bands.bands) &&
					allFinite(remedies) &&
					r.pairs.length === input.modes.length * r.lines.length
				);
			}),
			{ numRuns: 300 }
		);
		expect(
			evaluateCheck({
				speedRange: { minRpm: 0, maxRpm: 10 },
				measuredRpm: 5,
				sources: [],
				modes: [],
				rule: { kind: 'fixed', percent: 10 }
			}).pairs
		).toEqual([]);
	});

	it('the fleet path (no pair table, catalogue built once) gives the same verdicts and worst pairs as the full table', () => {
		fc.assert(
			fc.property(check, (input) => {
				const full = evaluateCheck(input);
				const fast = evaluateCheck(
					{ ...input, lines: excitationCatalogue(input.sources) },
					{ pairs: false }
				);
				const worst = [...full.pairs].sort((a, b) => comparePairs(a, b, 'range'))[0] ?? null;
				const worstAt =
					[...full.pairs]
						.filter((p) => p.verdictAtSpeed !== null)
						.sort((a, b) => comparePairs(a, b, 'speed'))[0] ?? null;
				return (
					fast.pairs.length === 0 &&
					fast.verdict === full.verdict &&
					fast.verdictAtSpeed === full.verdictAtSpeed &&
					JSON.stringify(fast.worstOverRange) === JSON.stringify(full.worstOverRange) &&
					(worst === null || comparePairs(worst, full.worstOverRange!, 'range') === 0) &&
					(worstAt === null || comparePairs(worstAt, full.worstAtSpeed!, 'speed') === 0)
				);
			}),
			{ numRuns: 300 }
		);
		expect(() =>
			evaluateCheck({
				speedRange: { minRpm: 1, maxRpm: 2 },
				measuredRpm: 1,
				sources: [],
				lines: [{ id: 'x', sourceId: 'x', kind: 'shaft', label: 'x', order: -1, fixedHz: null }],
				modes: [],
				rule: { kind: 'fixed', percent: 10 }
			})
		).toThrow(/lines\[0\]/);
	});

	it('the oscillator and its free response stay finite for every valid m, k, c and time', () => {
		fc.assert(
			fc.property(
				fc.double({ min: 1e-3, max: 1e5, noNaN: true }),
				fc.double({ min: 1e-2, max: 1e9, noNaN: true }),
				fc.double({ min: 0, max: 1e6, noNaN: true }),
				fc.double({ min: 0, max: 10, noNaN: true }),
				(m, k, c, t) => {
					const o = oscillator({ mass: m, stiffness: k, damping: c });
					const r = freeResponse(o, { x0: 0.001, v0: 0.01 });
					return (
						allFinite(o) && Number.isFinite(r.displacement(t)) && Number.isFinite(r.velocity(t))
					);
				}
			)
		);
		expect(oscillator({ mass: 1, stiffness: 1 }).omega0).toBe(1);
	});
});
