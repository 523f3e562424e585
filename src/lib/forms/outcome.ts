/**
 * What every form action of the app answers, refused or done, and the one reader pages use.
 *
 * A page has several forms, often one per row (a user, a site, a follow-up): `action` names the
 * form and `id` the row it was sent for (null for a form that names no row), so the message
 * appears under the form that was sent and nowhere else. The server builds it with
 * `failAction` / `doneAction` (`$lib/server/forms`), which keep the real HTTP status.
 */
export interface ActionOutcome {
	action: string;
	id: string | null;
	/** field → message; `form` for a message about the whole form */
	errors?: Record<string, string>;
	/** what was typed, to put back into a refused form */
	values?: Record<string, string>;
	/** the confirmation of a form that went through */
	done?: string;
}

export function isOutcome(form: unknown): form is ActionOutcome {
	return (
		typeof form === 'object' &&
		form !== null &&
		typeof (form as { action?: unknown }).action === 'string'
	);
}

export interface OutcomeReader {
	/** the field messages of this form (empty when another form was sent or it went through) */
	errors(action: string, id?: string | null): Record<string, string>;
	/** the confirmation of this form, if it was the one sent and went through */
	done(action: string, id?: string | null): string | undefined;
	/** what was typed into this form, when it was refused */
	values(action: string, id?: string | null): Record<string, string>;
}

/** Reads a page's `form` prop: `const out = $derived(outcomeOf(form))`, then `out.errors('save', row.id)`. */
export function outcomeOf(form: unknown): OutcomeReader {
	const outcome = isOutcome(form) ? form : null;
	const of = (action: string, id: string | null = null) =>
		outcome && outcome.action === action && (outcome.id ?? null) === id ? outcome : null;
	return {
		errors: (action, id) => of(action, id)?.errors ?? {},
		done: (action, id) => of(action, id)?.done,
		values: (action, id) => of(action, id)?.values ?? {}
	};
}
