/** `npm run seed`: migrates the database at DATABASE_URL and adds the demo data (idempotent). */
import { DEFAULT_DATABASE_URL, openDatabase, runMigrations } from '../db/client.ts';
import { seed } from '../db/seed.ts';

const { db, sqlite, file } = openDatabase(process.env.DATABASE_URL || DEFAULT_DATABASE_URL);
runMigrations(db);
const report = await seed(db);
sqlite.close();
console.log(
	`demo data in ${file}: added ${report.sites} sites, ${report.users} users, ${report.assets} assets, ${report.sources} excitation sources, ${report.checks} checks`
);
