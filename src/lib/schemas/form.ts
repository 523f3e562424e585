/** Helpers every server form uses: FormData in, field messages out. */
import type { z } from 'zod';

/** Field messages from a failed parse: `{ field: 'first message' }`. */
export function fieldErrors(error: z.ZodError): Record<string, string> {
	const out: Record<string, string> = {};
	for (const issue of error.issues) {
		const key = issue.path.length ? String(issue.path[0]) : 'form';
		out[key] ??= issue.message;
	}
	return out;
}

/** FormData → plain object, with the listed keys gathered as arrays (multi-selects, checkboxes). */
export function formToObject(form: FormData, arrays: string[] = []): Record<string, unknown> {
	const out: Record<string, unknown> = {};
	for (const key of new Set(form.keys())) {
		const values = form.getAll(key).filter((v): v is string => typeof v === 'string');
		out[key] = arrays.includes(key) ? values : values[0];
	}
	for (const key of arrays) out[key] ??= [];
	return out;
}

/** A page address as an object for its schema; an empty parameter counts as absent. */
export const queryToObject = (params: URLSearchParams): Record<string, string> =>
	Object.fromEntries([...params].filter(([, v]) => v !== ''));

/** A typed decimal ("17,2" or "17.2"): null when empty, NaN (which schemas refuse) when no number. */
export const decimalOrNull = (text: string): number | null =>
	text.trim() === '' ? null : Number(text.replace(',', '.'));
