/** The server half of `$lib/forms/outcome`: every form action answers through these two. */
import { fail, type ActionFailure } from '@sveltejs/kit';
import type { ActionOutcome } from '../forms/outcome.ts';

/**
 * A refused form: its real status (400 bad input, 404 gone, 409 conflict …), the messages by field
 * and, when given, what was typed (strings only: a password or a file is never sent back).
 */
export function failAction(
	status: number,
	action: string,
	id: string | null,
	errors: Record<string, string>,
	values?: Record<string, unknown>
): ActionFailure<ActionOutcome> {
	const outcome: ActionOutcome = { action, id, errors };
	if (values) {
		outcome.values = {};
		for (const [k, v] of Object.entries(values))
			if (typeof v === 'string' && !/password/i.test(k)) outcome.values[k] = v;
	}
	return fail(status, outcome);
}

/** A form that went through, with the confirmation shown under it. */
export function doneAction(action: string, id: string | null, done: string): ActionOutcome {
	return { action, id, done };
}
