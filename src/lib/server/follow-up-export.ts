/** The follow-ups list as a table (the page's filters applied), for CSV and Excel alike. */
import { error, type RequestEvent } from '@sveltejs/kit';
import { parseListQuery } from '../schemas/follow-up.ts';
export { FOLLOW_UP_COLUMNS } from '../schemas/follow-up.ts';
import { requireUser } from './guard.ts';
import * as followUps from './db/follow-ups.ts';

export function followUpTable(event: RequestEvent) {
	const user = requireUser(event);
	const parsed = parseListQuery(event.url.searchParams);
	if (!parsed.success) error(400, parsed.error.issues[0].message);
	const rows = followUps.listFor(user, parsed.data, new Date().toISOString().slice(0, 10));
	return rows.map((f) => [
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
}
