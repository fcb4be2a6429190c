// A fresh in-memory database (migrated) with one user and one project, for the stratigraphy service tests.
import { openDatabase, type Db } from '../../../src/lib/server/db';
import { memberships, projects, users } from '../../../src/lib/server/db/schema';
import { soundings } from '../../../src/lib/server/db/site-schema';
import { toFloat64Blob } from '../../../src/lib/server/db/float64';

export interface SiteTestProject {
	db: Db;
	projectId: string;
	userId: string;
}

export function siteTestProject(name = 'Stratigraphy test'): SiteTestProject {
	const db = openDatabase(':memory:');
	const user = db.insert(users).values({ email: `${crypto.randomUUID()}@conefield.test`, name: 'Sam Strat' }).returning().get();
	const project = db.insert(projects).values({ name, createdBy: user.id }).returning().get();
	db.insert(memberships).values({ projectId: project.id, userId: user.id, role: 'owner' }).run();
	return { db, projectId: project.id, userId: user.id };
}

/** Stores a sounding with constant readings every 0.1 m from 0.1 m to `maxDepth`. */
export function addSounding(
	db: Db,
	projectId: string,
	name: string,
	{ chainage = null as number | null, x = null as number | null, y = null as number | null, groundElevation = 0, maxDepth = 3, qc = 5000 } = {}
): string {
	const n = Math.round(maxDepth / 0.1);
	const depth = Array.from({ length: n }, (_, i) => Math.round((i + 1) * 0.1 * 1000) / 1000);
	return db
		.insert(soundings)
		.values({
			projectId,
			name,
			x,
			y,
			chainage,
			groundElevation,
			readings: n,
			maxDepth,
			maxQc: qc,
			depth: toFloat64Blob(depth),
			qc: toFloat64Blob(depth.map(() => qc)),
			fs: toFloat64Blob(depth.map(() => qc * 0.01)),
			u2: toFloat64Blob(depth.map(() => 10))
		})
		.returning()
		.get().id;
}
