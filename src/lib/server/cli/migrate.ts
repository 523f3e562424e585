/** `npm run db:migrate`: applies the committed migrations to DATABASE_URL. */
import { DEFAULT_DATABASE_URL, openDatabase, runMigrations } from '../db/client.ts';

const { db, sqlite, file } = openDatabase(process.env.DATABASE_URL || DEFAULT_DATABASE_URL);
runMigrations(db);
sqlite.close();
console.log('migrations applied to', file);
