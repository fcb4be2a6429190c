// A fresh in-memory database with one user and one project, for the soundings and import service tests.
import { openDatabase, type Db } from '../../../src/lib/server/db';
import { memberships, projects, users } from '../../../src/lib/server/db/schema';

export interface TestProject {
	db: Db;
	projectId: string;
	userId: string;
}

export async function testProject(name = 'Test project'): Promise<TestProject> {
	const db = openDatabase(':memory:');
	await ensureSiteTables(db);
	return addProject(db, name);
}

/** Another project (with its own owner) in the same database. */
export function addProject(db: Db, name: string): TestProject {
	const user = db.insert(users).values({ email: `${crypto.randomUUID()}@conefield.test`, name: 'Tess Tester' }).returning().get();
	const project = db.insert(projects).values({ name, createdBy: user.id }).returning().get();
	db.insert(memberships).values({ projectId: project.id, userId: user.id, role: 'owner' }).run();
	return { db, projectId: project.id, userId: user.id };
}

// TEMPORARY until the site-model migration is committed: creates the site tables from site-schema.ts.
async function ensureSiteTables(db: Db): Promise<void> {
	const has = db.$client.prepare("SELECT name FROM sqlite_master WHERE type = 'table' AND name = 'soundings'").get();
	if (has) return;
	const api = await import('drizzle-kit/api');
	const base = await import('../../../src/lib/server/db/schema');
	const site = await import('../../../src/lib/server/db/site-schema');
	const prev = await api.generateSQLiteDrizzleJson({ ...base });
	const next = await api.generateSQLiteDrizzleJson({ ...base, ...site });
	for (const statement of await api.generateSQLiteMigration(prev, next)) db.$client.exec(statement);
}
