import type { LayoutServerLoad } from './$types';
import { navFor } from '$lib/access';
import { requireUser } from '$lib/server/guard';

/** Everything under (app) needs a signed-in user; each page checks its own role as well. */
export const load: LayoutServerLoad = (event) => {
	const user = requireUser(event);
	return {
		user: {
			id: user.id,
			name: user.name,
			email: user.email,
			role: user.role,
			unitSystem: user.unitSystem,
			frequencyUnit: user.frequencyUnit
		},
		nav: navFor(user.role)
	};
};
