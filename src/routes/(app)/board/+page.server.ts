import type { PageServerLoad } from './$types';
import * as board from '$lib/server/db/board';
import { requireUser } from '$lib/server/guard';

/** The filter choices; the rows come from /api/board, fetched by the page. */
export const load: PageServerLoad = (event) => {
	requireUser(event);
	return board.filterOptions();
};
