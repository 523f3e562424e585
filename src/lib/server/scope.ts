/**
 * One answer to "may this user read this?" for every row that names an asset: the asset itself,
 * a check, a recording, a follow-up. Technicians read the assets of their sites; supervisors,
 * planners and admins every site (roles.ts, FLEET_WIDE). Each function returns the row when the
 * user may read it and null otherwise — the caller answers 404 either way, so a row on another
 * site is indistinguishable from one that does not exist.
 */
import { eq } from 'drizzle-orm';
import { db } from './db/index.ts';
import { assets, checks, followUps, recordings } from './db/schema.ts';
import { inScope, visibleSiteIds } from './db/assets.ts';
import type { Role } from '../roles.ts';
import type { Tx } from './db/client.ts';

export interface Reader {
	id: string;
	role: Role;
}

type Read = Pick<Tx, 'select'>;

/** The sites a user may read ('all' for fleet-wide roles). */
export const sitesOf = (user: Reader) => visibleSiteIds(user);

export function mayReadSite(user: Reader, siteId: string): boolean {
	return inScope(visibleSiteIds(user), siteId);
}

export function readableAsset(user: Reader, assetId: string, tx: Read = db) {
	const asset = tx.select().from(assets).where(eq(assets.id, assetId)).get();
	return asset && mayReadSite(user, asset.siteId) ? asset : null;
}

export function readableCheck(user: Reader, checkId: string, tx: Read = db) {
	const check = tx.select().from(checks).where(eq(checks.id, checkId)).get();
	return check && readableAsset(user, check.assetId, tx) ? check : null;
}

export function readableRecording(user: Reader, recordingId: string, tx: Read = db) {
	const rec = tx.select().from(recordings).where(eq(recordings.id, recordingId)).get();
	return rec && readableAsset(user, rec.assetId, tx) ? rec : null;
}

export function readableFollowUp(user: Reader, followUpId: string, tx: Read = db) {
	const f = tx.select().from(followUps).where(eq(followUps.id, followUpId)).get();
	return f && readableAsset(user, f.assetId, tx) ? f : null;
}
