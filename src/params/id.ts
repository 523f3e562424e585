import type { ParamMatcher } from '@sveltejs/kit';
import { isUuid } from '$lib/ids';

/** Ids are UUID-shaped: anything else is a 404 before any code runs. */
export const match: ParamMatcher = (param) => isUuid(param);
