// A fresh in-memory database with one user and one project, for the soundings and import service tests.
import { openDatabase, type Db } from '../../../src/lib/server/db';
import { memberships, projects, users } from '../../../src/lib/server/db/schema';

export interface TestProject {
	db: Db;
	projectId: string;
	userId: string;
}

export async function testProject(name = 'Test project'): Promise<TestProject> {
	return addProject(openDatabase(':memory:'), name);
}

/** Another project (with its own owner) in the same database. */
export function addProject(db: Db, name: string): TestProject {
	const user = db.insert(users).values({ email: `${crypto.randomUUID()}@conefield.test`, name: 'Tess Tester' }).returning().get();
	const project = db.insert(projects).values({ name, createdBy: user.id }).returning().get();
	db.insert(memberships).values({ projectId: project.id, userId: user.id, role: 'owner' }).run();
	return { db, projectId: project.id, userId: user.id };
}
