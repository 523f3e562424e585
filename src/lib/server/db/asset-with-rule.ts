/**
 * An asset with its excitation sources (in their order) and its rule set, read through the
 * transaction it is given: no import of the app's own database, so the seed and its command line
 * can use it on the database they build.
 */
import { asc, eq } from 'drizzle-orm';
import type { Tx } from './client.ts';
import { assets, excitationSources, ruleSets } from './schema.ts';

/**
 * An asset with what its margins need: its excitation sources in their order and its rule set.
 * The one read behind push, the board status and the asset sheet, inside the caller's transaction.
 */
export function withSourcesAndRule(tx: Pick<Tx, 'select'>, id: string) {
	const asset = tx.select().from(assets).where(eq(assets.id, id)).get();
	if (!asset) return null;
	const sources = tx
		.select()
		.from(excitationSources)
		.where(eq(excitationSources.assetId, id))
		.orderBy(asc(excitationSources.sortOrder))
		.all();
	const ruleSet = asset.ruleSetId
		? (tx.select().from(ruleSets).where(eq(ruleSets.id, asset.ruleSetId)).get() ?? null)
		: null;
	return { asset, sources, ruleSet };
}
