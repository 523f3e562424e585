import { error } from '@sveltejs/kit';
import type { RequestHandler } from './$types';
import { parseListQuery } from '$lib/schemas/follow-up';
import { requireUser } from '$lib/server/guard';
import * as followUps from '$lib/server/db/follow-ups';
import { toCsv } from '$lib/server/csv';

/** GET: the follow-ups (filters as on the page) as CSV. */
export const GET: RequestHandler = (event) => {
	const user = requireUser(event);
	const parsed = parseListQuery(event.url.searchParams);
	if (!parsed.success) error(400, parsed.error.issues[0].message);
	const rows = followUps.listFor(user, parsed.data, new Date().toISOString().slice(0, 10));
	const head = [
		'tag',
		'asset',
		'site',
		'title',
		'status',
		'priority',
		'due_date',
		'assignee',
		'created',
		'notes'
	];
	const data = rows.map((f) => [
		f.tag,
		f.assetName,
		f.site,
		f.title,
		f.status,
		f.priority,
		f.dueDate ?? '',
		f.assigneeName ?? '',
		new Date(f.createdAt).toISOString(),
		f.notes
	]);
	return new Response(toCsv(head, data), {
		headers: {
			'content-type': 'text/csv; charset=utf-8',
			'content-disposition': 'attachment; filename="detune-follow-ups.csv"'
		}
	});
};
