/**
 * The body length a request declares (Content-Length), or null when it does not say (chunked):
 * routes refuse an oversized upload from this before reading any of it.
 */
export function declaredLength(request: Request): number | null {
	const n = Number(request.headers.get('content-length') ?? 'NaN');
	return Number.isFinite(n) && n >= 0 ? n : null;
}
