/**
 * The application's database handle. The path comes from DATABASE_URL, with the embedded default
 * under data/. Opening fails fast (at import) if the file cannot be opened.
 */
import { setting } from '../config.ts';
import { DEFAULT_DATABASE_URL, openDatabase } from './client.ts';

const opened = openDatabase(setting('DATABASE_URL') ?? DEFAULT_DATABASE_URL);

export const db = opened.db;
export const sqlite = opened.sqlite;
export const databaseFile = opened.file;
export type { Db } from './client.ts';
