import { error, json } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guard';
import { visibleSiteIds } from '$lib/server/db/assets';
import * as board from '$lib/server/db/board';
import { boardQuery, type BoardRow } from '$lib/schemas/board';
import { toCsv } from '$lib/server/csv';
import { frequencyNumber, pairLabel, type FrequencyUnit } from '$lib/frequency';

/** The CSV's columns; the worst pair's frequency in the reader's unit, named in its heading. */
const csvColumns = (unit: FrequencyUnit): [string, (r: BoardRow) => unknown][] => [
	['tag', (r) => r.tag],
	['name', (r) => r.name],
	['site', (r) => r.site],
	['area', (r) => r.area ?? ''],
	['machine_kind', (r) => r.machineKind],
	['drive', (r) => r.driveType],
	['min_rpm', (r) => r.minRpm],
	['max_rpm', (r) => r.maxRpm],
	['checked_at', (r) => (r.checkedAt ? new Date(r.checkedAt).toISOString() : '')],
	['checked_by', (r) => r.checkedBy ?? ''],
	['measured_rpm', (r) => r.measuredRpm ?? ''],
	[
		'worst_margin_at_speed_pct',
		(r) => (r.worstMarginAtSpeedPct === null ? '' : r.worstMarginAtSpeedPct.toFixed(2))
	],
	[
		'worst_margin_over_range_pct',
		(r) => (r.worstMarginOverRangePct === null ? '' : r.worstMarginOverRangePct.toFixed(2))
	],
	[
		'worst_pair',
		(r) =>
			r.worstNaturalHz === null || r.worstLabel === null
				? ''
				: pairLabel(r.worstNaturalHz, r.worstLabel, unit)
	],
	[
		`worst_natural_frequency_${unit.toLowerCase()}`,
		(r) => (r.worstNaturalHz === null ? '' : frequencyNumber(r.worstNaturalHz, unit))
	],
	['verdict', (r) => r.verdict],
	['overall_velocity_mm_s', (r) => r.overallVelocityMmS ?? ''],
	['severity_zone', (r) => r.severityZone ?? ''],
	['stale', (r) => (r.stale ? 'yes' : 'no')],
	['open_follow_ups', (r) => r.openFollowUps]
];

/** GET /api/board — the Margin board's rows (JSON), or the whole filtered list as CSV (?format=csv). */
export const GET: RequestHandler = (event) => {
	const user = requireUser(event);
	const parsed = boardQuery.safeParse(Object.fromEntries(event.url.searchParams));
	if (!parsed.success)
		error(400, {
			message: `${parsed.error.issues[0].path.join('.') || 'query'}: ${parsed.error.issues[0].message}`,
			code: 'bad-query'
		});
	const q = parsed.data;
	const scope = visibleSiteIds(user);
	if (q.format === 'csv') {
		const rows = board.all(q, scope);
		const columns = csvColumns(user.frequencyUnit);
		const text = toCsv(
			columns.map((c) => c[0]),
			rows.map((r) => columns.map(([, f]) => f(r)))
		);
		return new Response(text, {
			headers: {
				'content-type': 'text/csv; charset=utf-8',
				'content-disposition': 'attachment; filename="detune-margin-board.csv"',
				'cache-control': 'no-store'
			}
		});
	}
	return json(board.query(q, scope), { headers: { 'cache-control': 'no-store' } });
};
