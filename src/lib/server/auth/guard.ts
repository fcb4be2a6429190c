import { error, type RequestEvent } from '@sveltejs/kit';
import { and, eq } from 'drizzle-orm';
import { getDb } from '$lib/server/db';
import { memberships, projects, type Project } from '$lib/server/db/schema';
import { decideAccess, describeRequirement, type ProjectRole, type RoleRequirement } from './roles';

export interface ProjectAccess {
	user: NonNullable<App.Locals['user']>;
	project: Project;
	role: ProjectRole;
}

/** The signed-in user (session or API token), or a 401. */
export function requireUser(event: Pick<RequestEvent, 'locals'>): NonNullable<App.Locals['user']> {
	const user = event.locals.user;
	if (!user) error(401, 'Sign in to continue.');
	return user;
}

/** The signed-in site admin, or 401/403. */
export function requireAdmin(event: Pick<RequestEvent, 'locals'>): NonNullable<App.Locals['user']> {
	const user = requireUser(event);
	if (user.siteRole !== 'admin') error(403, 'Only site administrators may do this.');
	return user;
}

/**
 * Guards every project-scoped load, action and endpoint.
 * 401 when nobody is signed in, 404 when the user is not a member (whether or not the project exists),
 * 403 when the user's role does not meet `required` (a CAPABILITIES entry: a least role, or a list of roles).
 */
export function requireProjectRole(
	event: Pick<RequestEvent, 'locals'>,
	projectId: string | undefined,
	required: RoleRequirement
): ProjectAccess {
	const user = event.locals.user;
	const row =
		user && projectId
			? getDb()
					.select({ project: projects, role: memberships.role })
					.from(projects)
					.innerJoin(memberships, and(eq(memberships.projectId, projects.id), eq(memberships.userId, user.id)))
					.where(eq(projects.id, projectId))
					.get()
			: undefined;
	switch (decideAccess(user != null, row?.role, required)) {
		case 'unauthenticated':
			error(401, 'Sign in to continue.');
		case 'not_found':
			error(404, 'Project not found.');
		case 'forbidden':
			error(403, `This needs ${describeRequirement(required)} on the project.`);
		case 'allow':
			return { user: user!, project: row!.project, role: row!.role };
	}
}
