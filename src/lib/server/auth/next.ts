/**
 * Where a sign-in may send the user next: only a path on this site. The value is parsed as a URL
 * against a placeholder origin, the way a browser would resolve it; anything that lands elsewhere,
 * or carries control characters or backslashes (which browsers strip or turn into slashes, so
 * "/\t/evil.example" becomes "//evil.example"), is refused.
 */
const BASE = 'http://detune.invalid';

export function safeNext(next: string | null | undefined): string | null {
	if (!next || next.length > 2000) return null;
	// eslint-disable-next-line no-control-regex
	if (/[\u0000-\u001f\u007f\\]/.test(next)) return null;
	if (!next.startsWith('/') || next.startsWith('//')) return null;
	let url: URL;
	try {
		url = new URL(next, BASE);
	} catch {
		return null;
	}
	if (url.origin !== BASE) return null;
	return url.pathname + url.search + url.hash;
}
