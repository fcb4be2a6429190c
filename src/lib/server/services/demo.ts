import { count } from 'drizzle-orm';
import type { Db } from '$lib/server/db';
import { memberships, projects, users, type ProjectRole, type SiteRole } from '$lib/server/db/schema';
import { hashPassword } from '$lib/server/auth/password';
import { seedDemoSoundings } from './demo-soundings';
import { seedDemoStratigraphy } from './demo-stratigraphy';
import { seedDemoVariograms } from './demo-variograms';
import { seedDemoRecipes } from './demo-simulations';
import { asActor } from './audit';
import { seedDemoTransfers } from './demo-transfers';

/** The demo accounts. Their passwords are printed in the README: for a local demo only. */
export const DEMO_ACCOUNTS: ReadonlyArray<{
	email: string;
	name: string;
	password: string;
	siteRole: SiteRole;
	projectRole: ProjectRole | null;
}> = [
	{ email: 'admin@conefield.test', name: 'Ada Admin', password: 'demo-admin-pass', siteRole: 'admin', projectRole: null },
	{ email: 'owner@conefield.test', name: 'Olu Owner', password: 'demo-owner-pass', siteRole: 'member', projectRole: 'owner' },
	{ email: 'analyst@conefield.test', name: 'Ana Analyst', password: 'demo-analyst-pass', siteRole: 'member', projectRole: 'analyst' },
	{ email: 'reviewer@conefield.test', name: 'Rui Reviewer', password: 'demo-reviewer-pass', siteRole: 'member', projectRole: 'reviewer' },
	{ email: 'viewer@conefield.test', name: 'Vera Viewer', password: 'demo-viewer-pass', siteRole: 'member', projectRole: 'viewer' }
];

export const DEMO_PROJECT = {
	name: 'Riverside levee (demo)',
	description:
		'An invented river levee reach on loose alluvial sands over soft clay, used to show the workflow from CPT soundings to conditional random fields.',
	lengthUnit: 'm' as const
};

/**
 * Seeds the demo accounts and project into an empty database (no users yet); does nothing otherwise: the
 * accounts, the project, its soundings and stratigraphy in one transaction, then a saved variogram for every
 * domain (seedDemoVariograms), the recipes (seedDemoRecipes) by the analyst, and a transfer set (seedDemoTransfers).
 * Returns the demo project's id when it seeded. Later stages add their demo data here.
 */
export async function seedDemo(db: Db): Promise<string | null> {
	const existing = db.select({ n: count() }).from(users).get()?.n ?? 0;
	if (existing > 0) return null;
	const hashes = await Promise.all(DEMO_ACCOUNTS.map((a) => hashPassword(a.password)));
	const seeded = db.transaction((tx) => {
		const created = DEMO_ACCOUNTS.map((a, i) =>
			tx
				.insert(users)
				.values({ email: a.email, name: a.name, passwordHash: hashes[i], siteRole: a.siteRole, emailVerified: new Date() })
				.returning()
				.get()
		);
		const owner = created[DEMO_ACCOUNTS.findIndex((a) => a.projectRole === 'owner')];
		const project = tx.insert(projects).values({ ...DEMO_PROJECT, createdBy: owner.id }).returning().get();
		DEMO_ACCOUNTS.forEach((a, i) => {
			if (a.projectRole) tx.insert(memberships).values({ projectId: project.id, userId: created[i].id, role: a.projectRole }).run();
		});
		// The owner uploads the soundings and lays out the stratigraphy (so the audit log names them).
		asActor(owner.id, () => {
			seedDemoSoundings(tx, project.id, owner.id);
			seedDemoStratigraphy(tx, project.id);
		});
		const analyst = created[DEMO_ACCOUNTS.findIndex((a) => a.projectRole === 'analyst')];
		return { projectId: project.id, analystId: analyst.id };
	});
	// Computed outside the first transaction (the variograms are computed asynchronously, as in the workspace).
	await seedDemoVariograms(db, seeded.projectId, seeded.analystId);
	seedDemoRecipes(db, seeded.projectId, seeded.analystId);
	seedDemoTransfers(db, seeded.projectId, seeded.analystId);
	return seeded.projectId;
}
