import { error } from '@sveltejs/kit';
import type { PageServerLoad } from './$types';
import { requireUser } from '$lib/server/guard';
import * as audit from '$lib/server/db/audit';
import * as users from '$lib/server/db/users';
import * as assetQueries from '$lib/server/db/assets';
import { inWords } from '$lib/server/audit-words';
import { parseAuditQuery } from '$lib/schemas/audit';

export const load: PageServerLoad = (event) => {
	const user = requireUser(event);
	const q = parseAuditQuery(event.url.searchParams);
	if (!q.success) error(400, q.error.issues[0].message);
	return {
		query: q.data,
		lines: inWords(audit.search(q.filter, 300), user.frequencyUnit),
		users: users.list().map((u) => ({ id: u.id, name: u.name })),
		assets: assetQueries.listVisible(user).map((a) => ({ id: a.id, tag: a.tag, name: a.name }))
	};
};
