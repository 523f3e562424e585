import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { requireUser } from '$lib/server/guard';
import * as audit from '$lib/server/db/audit';
import { inWords } from '$lib/server/audit-words';
import { parseAuditQuery } from '$lib/schemas/audit';
import { toCsv } from '$lib/server/csv';

/** GET /admin/audit/export.csv?asset=…&user=…&from=…&to=…: the filtered log, one row per change. */
export const GET: RequestHandler = (event) => {
	const user = requireUser(event);
	const q = parseAuditQuery(event.url.searchParams);
	if (!q.success) error(400, q.error.issues[0].message);
	const rows = inWords(audit.search(q.filter, 100_000), user.frequencyUnit).flatMap((l) =>
		(l.changes.length ? l.changes : [{ field: '', before: '', after: '' }]).map((c) => ({
			when_utc: new Date(l.at).toISOString(),
			who: l.who,
			subject: l.subject,
			action: l.action,
			field: c.field,
			before: c.before,
			after: c.after
		}))
	);
	const head = ['when_utc', 'who', 'subject', 'action', 'field', 'before', 'after'] as const;
	return new Response(
		toCsv(
			[...head],
			rows.map((r) => head.map((h) => r[h]))
		),
		{
			headers: {
				'content-type': 'text/csv; charset=utf-8',
				'content-disposition': 'attachment; filename="detune-audit.csv"',
				'cache-control': 'no-store'
			}
		}
	);
};
