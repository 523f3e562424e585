/** Recording metadata (the files live under the data folder, named by hash). */
import { desc, eq } from 'drizzle-orm';
import { db } from './index.ts';
import { recordings } from './schema.ts';

export function byId(id: string) {
	return db.select().from(recordings).where(eq(recordings.id, id)).get();
}

export function forAsset(assetId: string) {
	return db
		.select()
		.from(recordings)
		.where(eq(recordings.assetId, assetId))
		.orderBy(desc(recordings.createdAt))
		.all();
}
