/** Escapes text for HTML built by hand (the refusal page, mail bodies). */
export const escapeHtml = (s: string): string =>
	s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
