/**
 * Query strings for links and navigation: a copy of `base` with `changes` applied (null or '' deletes
 * a key). Plain `.ts`, so the temporary URLSearchParams is not mistaken for component state.
 */
export function withParams(
	base: URLSearchParams | Record<string, string>,
	changes: Record<string, string | null | undefined> = {},
	drop: string[] = []
): string {
	const next = new URLSearchParams(base);
	for (const [k, v] of Object.entries(changes)) {
		if (v === null || v === undefined || v === '') next.delete(k);
		else next.set(k, v);
	}
	for (const k of drop) next.delete(k);
	return next.toString();
}
