import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { requireUser } from '$lib/server/guard';
import * as users from '$lib/server/db/users';
import { fieldErrors, formToObject } from '$lib/schemas/form';
import { doneAction, failAction } from '$lib/server/forms';

const unitsForm = z
	.object({ unitSystem: z.enum(['metric', 'us'], { error: 'Units: metric or US customary.' }) })
	.strict();

// the current choice comes with the layout's user
export const load: PageServerLoad = (event) => {
	requireUser(event);
};

export const actions: Actions = {
	units: async (event) => {
		const user = requireUser(event);
		const parsed = unitsForm.safeParse(formToObject(await event.request.formData()));
		if (!parsed.success) return failAction(400, 'units', null, fieldErrors(parsed.error));
		users.setUnitSystem(user.id, parsed.data.unitSystem);
		return doneAction(
			'units',
			null,
			parsed.data.unitSystem === 'us'
				? 'Saved: lengths in inches from now on.'
				: 'Saved: lengths in millimetres from now on.'
		);
	}
};
