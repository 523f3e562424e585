/** `npm run backup [-- <folder>]`: an online backup of the database and the uploaded files. */
import { resolve } from 'node:path';
import { DEFAULT_DATABASE_URL } from '../db/client.ts';
import { backup } from '../backup.ts';

const db = process.env.DATABASE_URL || DEFAULT_DATABASE_URL;
const files = resolve(process.env.DATA_DIR ?? 'data/files');
const into = process.argv[2] ?? `backups/${new Date().toISOString().replace(/[:.]/g, '-')}`;
const m = await backup(db, files, into);
console.log(`backup of ${db} in ${resolve(into)}: integrity ${m.integrity}, ${m.files} files`);
