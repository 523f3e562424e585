/** The Margin board's query: filters, search, sorting and paging, as they appear in the URL. */
import { z } from 'zod';
import { MACHINE_KINDS_LIST } from './shared-enums.ts';

export const BOARD_SORTS = [
	'worst',
	'tag',
	'name',
	'site',
	'checked',
	'atSpeed',
	'overRange',
	'verdict',
	'zone',
	'followUps'
] as const;
/** vibration severity zones, and `none` for assets whose latest check has no level */
export const BOARD_ZONES = ['A', 'B', 'C', 'D', 'CD', 'none'] as const;
export const BOARD_VERDICTS = ['clear', 'tight', 'conflict', 'unchecked'] as const;

const optional = <T extends z.ZodType>(s: T) =>
	z.preprocess((v) => (v === '' || v === null ? undefined : v), s.optional());

export const boardQuery = z
	.object({
		site: optional(z.string().max(64)),
		area: optional(z.string().max(64)),
		verdict: optional(
			z.enum(BOARD_VERDICTS, { error: `verdict must be one of ${BOARD_VERDICTS.join(', ')}` })
		),
		stale: optional(z.enum(['yes', 'no'], { error: 'stale must be yes or no' })),
		zone: optional(z.enum(BOARD_ZONES, { error: `zone must be one of ${BOARD_ZONES.join(', ')}` })),
		kind: optional(
			z.enum(MACHINE_KINDS_LIST, { error: `kind must be one of ${MACHINE_KINDS_LIST.join(', ')}` })
		),
		q: optional(z.string().trim().max(100, 'search is at most 100 characters')),
		sort: z.preprocess(
			(v) => v || 'worst',
			z.enum(BOARD_SORTS, { error: `sort must be one of ${BOARD_SORTS.join(', ')}` })
		),
		dir: z.preprocess(
			(v) => v || 'asc',
			z.enum(['asc', 'desc'], { error: 'dir must be asc or desc' })
		),
		page: z.preprocess(
			(v) => (v === undefined || v === '' ? 1 : Number(v)),
			z
				.number({ error: 'page must be a number' })
				.int('page must be a whole number')
				.min(1, 'page starts at 1')
				.max(100_000)
		),
		size: z.preprocess(
			(v) => (v === undefined || v === '' ? 50 : Number(v)),
			z
				.number({ error: 'size must be a number' })
				.int()
				.min(1, 'size is at least 1')
				.max(500, 'size is at most 500')
		),
		format: optional(z.enum(['json', 'csv']))
	})
	.strict();

export type BoardQuery = z.infer<typeof boardQuery>;

export interface BoardRow {
	id: string;
	tag: string;
	name: string;
	site: string;
	area: string | null;
	machineKind: string;
	driveType: string;
	minRpm: number;
	maxRpm: number;
	checkedAt: number | null;
	checkedBy: string | null;
	measuredRpm: number | null;
	worstMarginAtSpeedPct: number | null;
	worstMarginOverRangePct: number | null;
	/** the worst pair's natural frequency (Hz) and its forcing label; shown in the reader's unit */
	worstNaturalHz: number | null;
	worstLabel: string | null;
	verdict: 'clear' | 'tight' | 'conflict' | 'unchecked';
	/** the latest check's overall velocity (mm/s r.m.s.) and its zone; null when none was taken */
	overallVelocityMmS: number | null;
	severityZone: 'A' | 'B' | 'C' | 'D' | null;
	stale: boolean;
	openFollowUps: number;
}

export interface BoardResponse {
	rows: BoardRow[];
	total: number;
	page: number;
	pageSize: number;
	counts: Record<'clear' | 'tight' | 'conflict' | 'unchecked', number>;
	staleCount: number;
}
