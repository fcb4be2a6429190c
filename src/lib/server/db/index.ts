import Database from 'better-sqlite3';
import { drizzle, type BetterSQLite3Database } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import { mkdirSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import * as coreSchema from './schema';
import * as siteSchema from './site-schema';
import * as recipeSchema from './recipe-schema';
import * as exportSchema from './export-schema';

const schema = { ...coreSchema, ...siteSchema, ...recipeSchema, ...exportSchema };

export type Db = BetterSQLite3Database<typeof schema> & { $client: Database.Database };

/** Where the database lives: DATABASE_URL (a path, optionally `file:`-prefixed, or `:memory:`) or ./data/conefield.db. */
export function databasePath(url = process.env.DATABASE_URL): string {
	const raw = url && url.trim() !== '' ? url.trim() : './data/conefield.db';
	return raw.startsWith('file:') ? raw.slice('file:'.length) : raw;
}

/** Where the generated migrations are; relative to the working directory, which `npm start` sets to the checkout. */
export function migrationsFolder(): string {
	return resolve(process.env.MIGRATIONS_DIR ?? 'drizzle');
}

/**
 * Opens a SQLite database with WAL and foreign keys on, and brings it to the latest migration.
 * WAL lets page loads read while a long write (an import) is in progress.
 */
export function openDatabase(path = databasePath()): Db {
	if (path !== ':memory:') mkdirSync(dirname(resolve(path)), { recursive: true });
	const sqlite = new Database(path);
	sqlite.pragma('journal_mode = WAL');
	sqlite.pragma('foreign_keys = ON');
	sqlite.pragma('busy_timeout = 5000');
	const db = drizzle(sqlite, { schema });
	migrate(db, { migrationsFolder: migrationsFolder() });
	return db;
}

let instance: Db | undefined;

/** The process-wide database, opened (and migrated) on first use. */
export function getDb(): Db {
	instance ??= openDatabase();
	return instance;
}

export { schema };
