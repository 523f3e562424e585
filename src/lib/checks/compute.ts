/**
 * One check computed from an asset, its rule set, the measured speed and the modes: the same code
 * on the tablet (at once, offline) and on the server (at sync, the result of record).
 */
import {
	avoidanceBands,
	DEFAULT_RULE,
	evaluateCheck,
	modeRemedies,
	type AvoidancePlan,
	type CheckResult,
	type ExcitationSource,
	type MarginRule,
	type Mode,
	type ModeRemedy
} from '../vibration/index.ts';
import { toEngineSources, type StoredSource } from '../schemas/excitation.ts';
import { pairLabel } from '../frequency.ts';

export interface AssetForCheck {
	minRpm: number;
	maxRpm: number;
	motorPoles: number | null;
	/** the motor's slip at rated load, %; null or absent: drive Hz and 2× line are synchronous */
	slipPct?: number | null;
	driveRatio: number;
	skipBands: number;
	sources: StoredSource[];
}

export interface RuleSetForCheck {
	kind: 'fixed' | 'amplification';
	percent: number | null;
	perKind: Record<string, number> | null;
}

export function ruleOf(ruleSet: RuleSetForCheck | null | undefined): MarginRule {
	if (!ruleSet) return DEFAULT_RULE;
	if (ruleSet.kind === 'amplification')
		return {
			kind: 'amplification',
			...(ruleSet.percent !== null ? { percent: ruleSet.percent } : {}),
			...(ruleSet.perKind ? { perKind: ruleSet.perKind } : {})
		};
	return {
		kind: 'fixed',
		percent: ruleSet.percent ?? 10,
		...(ruleSet.perKind ? { perKind: ruleSet.perKind } : {})
	};
}

export interface CheckSummary {
	verdict: CheckResult['verdict'];
	verdictAtSpeed: CheckResult['verdictAtSpeed'];
	worstMarginAtSpeedPct: number | null;
	worstMarginOverRangePct: number | null;
	/** "29.60 Hz × 2× running speed", as stored; screens compose it from the two fields below */
	worstPair: string | null;
	worstNaturalHz: number | null;
	worstLabel: string | null;
}

export interface ComputedCheck {
	result: CheckResult;
	bands: AvoidancePlan;
	remedies: ModeRemedy[];
	summary: CheckSummary;
	rule: MarginRule;
}

export function computeCheck(
	asset: AssetForCheck,
	ruleSet: RuleSetForCheck | null,
	measuredRpm: number | null,
	modes: Mode[]
): ComputedCheck {
	const rule = ruleOf(ruleSet);
	const slip = asset.slipPct === null || asset.slipPct === undefined ? null : asset.slipPct / 100;
	const input = {
		speedRange: { minRpm: asset.minRpm, maxRpm: asset.maxRpm },
		measuredRpm,
		sources: withSlip(toEngineSources(asset.sources), slip),
		modes,
		rule
	};
	const result = evaluateCheck(input);
	const bands = avoidanceBands(input, {
		poles: asset.motorPoles,
		slip,
		motorRpmPerShaftRpm: asset.driveRatio,
		skipBands: asset.skipBands
	});
	const remedies = modeRemedies(input);
	const w = result.worstOverRange;
	return {
		result,
		bands,
		remedies,
		rule,
		summary: {
			verdict: result.verdict,
			verdictAtSpeed: result.verdictAtSpeed,
			worstMarginAtSpeedPct: result.worstAtSpeed?.marginAtSpeedPct ?? null,
			worstMarginOverRangePct: w?.marginOverRangePct ?? null,
			worstPair: w ? pairLabel(w.naturalHz, w.label, 'Hz') : null,
			worstNaturalHz: w?.naturalHz ?? null,
			worstLabel: w?.label ?? null
		}
	};
}

/** Whether the device's figures match the server's (margins to 0.01 %). */
export function sameSummary(
	a: Pick<
		CheckSummary,
		'verdict' | 'verdictAtSpeed' | 'worstMarginAtSpeedPct' | 'worstMarginOverRangePct'
	>,
	b: typeof a
): boolean {
	const close = (x: number | null, y: number | null) =>
		x === null || y === null ? x === y : Math.abs(x - y) < 0.01;
	return (
		a.verdict === b.verdict &&
		a.verdictAtSpeed === b.verdictAtSpeed &&
		close(a.worstMarginAtSpeedPct, b.worstMarginAtSpeedPct) &&
		close(a.worstMarginOverRangePct, b.worstMarginOverRangePct)
	);
}

/** The asset's slip on every 2× line taken from a drive (the source gives poles and ratio). */
function withSlip(sources: ExcitationSource[], slip: number | null): ExcitationSource[] {
	if (slip === null) return sources;
	return sources.map((s) =>
		s.kind === 'line' && s.drive ? { ...s, drive: { ...s.drive, slip } } : s
	);
}
