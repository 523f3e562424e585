/** Ids are UUID-shaped (made by the server, or by the tablet for checks and recordings). */
export const isUuid = (s: string): boolean =>
	/^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(s);
