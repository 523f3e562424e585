import { getContext, setContext } from 'svelte';
import type { LocalUser } from '$lib/offline/session';

const KEY = Symbol('floor-user');

interface FloorContext {
	user: LocalUser | null;
}

/**
 * The user Floor check works for (from the server when online, from the tablet offline). The
 * layout sets the context when it starts and fills in the user once it is known; pages under it
 * render only then.
 */
export const setFloorContext = (ctx: FloorContext) => setContext(KEY, ctx);

export function getFloorUser(): LocalUser {
	const user = getContext<FloorContext>(KEY)?.user;
	if (!user) throw new Error('Floor check page rendered before its user was known.');
	return user;
}
