import { beforeAll, describe, expect, it } from 'vitest';
import { freshDatabase } from '../test-db.ts';
import { db } from './index.ts';
import { assets, ruleSets } from './schema.ts';
import * as rules from './rule-sets.ts';
import { eq, sql } from 'drizzle-orm';

beforeAll(async () => {
	await freshDatabase({ demo: true });
});

describe('the rule-set list', () => {
	it('counts the assets that use each rule set', () => {
		// before, the count's subquery named its columns unqualified, so it compared an asset's
		// rule set with its own id and every rule set read "0 assets"
		const counted = Object.fromEntries(rules.list().map((r) => [r.id, r.assets]));
		const truth = db
			.select({ id: ruleSets.id, n: sql<number>`count(${assets.id})` })
			.from(ruleSets)
			.leftJoin(assets, eq(assets.ruleSetId, ruleSets.id))
			.groupBy(ruleSets.id)
			.all();
		expect(truth.some((t) => t.n > 0)).toBe(true);
		for (const t of truth) expect(counted[t.id], t.id).toBe(t.n);
	});
});
