import type { Actions, PageServerLoad } from './$types';
import { requireRole } from '$lib/server/guard';
import * as severity from '$lib/server/db/severity';
import { inTurn } from '$lib/server/turns';
import { severityLimitsForm } from '$lib/schemas/severity';
import { fieldErrors, formToObject } from '$lib/schemas/form';
import { doneAction, failAction } from '$lib/server/forms';
import { EDITORS } from '$lib/roles';

export const load: PageServerLoad = (event) => {
	requireRole(event, EDITORS);
	return { limits: severity.allLimits() };
};

export const actions: Actions = {
	save: async (event) => {
		const actor = requireRole(event, EDITORS);
		const raw = formToObject(await event.request.formData());
		const id = `${raw.machineGroup ?? ''}/${raw.support ?? ''}`;
		const parsed = severityLimitsForm.safeParse(raw);
		if (!parsed.success) return failAction(400, 'save', id, fieldErrors(parsed.error), raw);
		try {
			const n = await inTurn(() => severity.updateLimits(parsed.data, actor.id));
			return doneAction(
				'save',
				id,
				`Saved; ${n} asset${n === 1 ? '' : 's'} with a level zoned again.`
			);
		} catch (e) {
			if (e instanceof severity.SeverityError)
				return failAction(404, 'save', id, { form: e.message });
			throw e;
		}
	}
};
