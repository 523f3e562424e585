import type { RequestHandler } from './$types';
import { toCsv } from '$lib/server/csv';
import { FOLLOW_UP_COLUMNS, followUpTable } from '$lib/server/follow-up-export';

/** GET: the follow-ups (filters as on the page) as CSV. */
export const GET: RequestHandler = (event) =>
	new Response(toCsv(FOLLOW_UP_COLUMNS, followUpTable(event)), {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': 'attachment; filename="detune-follow-ups.csv"'
		}
	});
