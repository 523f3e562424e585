import type { ParamMatcher } from '@sveltejs/kit';

/** Ids are UUID-shaped: anything else is a 404 before any code runs. */
export const match: ParamMatcher = (param) => /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(param);
