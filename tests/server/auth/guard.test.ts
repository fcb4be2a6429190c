import { isHttpError } from '@sveltejs/kit';
import { eq } from 'drizzle-orm';
import { beforeAll, describe, expect, it } from 'vitest';
import { getDb } from '$lib/server/db';
import { projects, users } from '$lib/server/db/schema';
import { requireAdmin, requireProjectRole, requireUser } from '$lib/server/auth/guard';
import { PROJECT_ROLES, roleRank, type ProjectRole } from '$lib/server/auth/roles';
import { DEMO_ACCOUNTS, seedDemo } from '$lib/server/services/demo';

type Locals = { locals: App.Locals };

function as(email: string | null): Locals {
	if (!email) return { locals: { user: null, authVia: null } as App.Locals };
	const u = getDb().select().from(users).where(eq(users.email, email)).get()!;
	return { locals: { user: { id: u.id, email: u.email, name: u.name, siteRole: u.siteRole }, authVia: 'session' } as App.Locals };
}

function statusOf(run: () => unknown): number {
	try {
		run();
		return 200;
	} catch (err) {
		if (isHttpError(err)) return err.status;
		throw err;
	}
}

let projectId: string;

beforeAll(async () => {
	process.env.DATABASE_URL = ':memory:';
	projectId = (await seedDemo(getDb()))!;
});

describe('requireProjectRole(event, projectId, minRole) on the seeded demo project', () => {
	const members = DEMO_ACCOUNTS.filter((a) => a.projectRole) as { email: string; projectRole: ProjectRole }[];

	it('answers 200 at or above the minimum role and 403 below it, for every member role × minimum', () => {
		for (const m of members) {
			for (const min of PROJECT_ROLES) {
				const expected = roleRank(m.projectRole) >= roleRank(min) ? 200 : 403;
				expect(statusOf(() => requireProjectRole(as(m.email), projectId, min)), `${m.projectRole} asks ${min}`).toBe(expected);
			}
		}
	});

	it('returns the user, the project and the member’s role', () => {
		const access = requireProjectRole(as('analyst@conefield.test'), projectId, 'viewer');
		expect(access.role).toBe('analyst');
		expect(access.project.id).toBe(projectId);
		expect(access.user.email).toBe('analyst@conefield.test');
	});

	it('answers 404 for a non-member (the site admin is not a member) and for a missing project', () => {
		for (const min of PROJECT_ROLES) expect(statusOf(() => requireProjectRole(as('admin@conefield.test'), projectId, min))).toBe(404);
		expect(statusOf(() => requireProjectRole(as('owner@conefield.test'), 'no-such-project', 'viewer'))).toBe(404);
		expect(statusOf(() => requireProjectRole(as('owner@conefield.test'), undefined, 'viewer'))).toBe(404);
	});

	it('answers 401 when nobody is signed in, even for a project that exists', () => {
		expect(statusOf(() => requireProjectRole(as(null), projectId, 'viewer'))).toBe(401);
	});
});

describe('requireUser / requireAdmin', () => {
	it('requireUser answers 401 for nobody and returns the user otherwise', () => {
		expect(statusOf(() => requireUser(as(null)))).toBe(401);
		expect(requireUser(as('viewer@conefield.test')).email).toBe('viewer@conefield.test');
	});

	it('requireAdmin answers 401 for nobody, 403 for a member and passes a site admin', () => {
		expect(statusOf(() => requireAdmin(as(null)))).toBe(401);
		expect(statusOf(() => requireAdmin(as('owner@conefield.test')))).toBe(403);
		expect(statusOf(() => requireAdmin(as('admin@conefield.test')))).toBe(200);
	});
});

describe('seedDemo(db)', () => {
	it('seeds once: a second call on a non-empty database does nothing', async () => {
		expect(await seedDemo(getDb())).toBeNull();
		expect(getDb().select().from(users).all()).toHaveLength(DEMO_ACCOUNTS.length);
		expect(getDb().select().from(projects).all()).toHaveLength(1);
	});
});
