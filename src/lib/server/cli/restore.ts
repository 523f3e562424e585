/** `npm run restore -- <folder>`: brings a backup back. Stop the server first. */
import { resolve } from 'node:path';
import { DEFAULT_DATABASE_URL } from '../db/client.ts';
import { restore, RestoreRefused } from '../backup.ts';

const from = process.argv[2];
if (!from) {
	console.error(
		'Give the backup folder: npm run restore -- backups/<when>   (stop the server first)'
	);
	process.exit(2);
}
const db = process.env.DATABASE_URL || DEFAULT_DATABASE_URL;
try {
	const m = restore(from, db, resolve(process.env.DATA_DIR ?? 'data/files'));
	console.log(
		`restored ${db} from the backup of ${m.createdAt} (${m.files} files); every session ended`
	);
} catch (e) {
	if (!(e instanceof RestoreRefused)) throw e;
	console.error(e.message);
	process.exit(1);
}
