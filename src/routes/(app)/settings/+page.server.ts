import { z } from 'zod';
import type { Actions, PageServerLoad } from './$types';
import { requireUser } from '$lib/server/guard';
import * as users from '$lib/server/db/users';
import { fieldErrors, formToObject } from '$lib/schemas/form';
import { doneAction, failAction } from '$lib/server/forms';
import { FREQUENCY_UNITS } from '$lib/frequency';

const unitsForm = z
	.object({ unitSystem: z.enum(['metric', 'us'], { error: 'Units: metric or US customary.' }) })
	.strict();

const frequencyForm = z
	.object({
		frequencyUnit: z.enum(FREQUENCY_UNITS, {
			error: 'Frequencies: Hz or CPM (cycles per minute).'
		})
	})
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
	},
	frequency: async (event) => {
		const user = requireUser(event);
		const parsed = frequencyForm.safeParse(formToObject(await event.request.formData()));
		if (!parsed.success) return failAction(400, 'frequency', null, fieldErrors(parsed.error));
		users.setFrequencyUnit(user.id, parsed.data.frequencyUnit);
		return doneAction(
			'frequency',
			null,
			parsed.data.frequencyUnit === 'CPM'
				? 'Saved: frequencies in CPM (cycles per minute) from now on. Floor check follows at its next contact with the server.'
				: 'Saved: frequencies in Hz from now on. Floor check follows at its next contact with the server.'
		);
	}
};
