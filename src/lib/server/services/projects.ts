import { asc, eq } from 'drizzle-orm';
import { getDb } from '$lib/server/db';
import { memberships, projects, type Project, type ProjectRole } from '$lib/server/db/schema';
import type { ProjectCreate, ProjectUpdate } from '$lib/schemas';
import { recordAudit } from './audit';

/** The fields of a project that may leave the server, with the caller's role on it. */
export interface ProjectView {
	id: string;
	name: string;
	description: string;
	lengthUnit: 'm' | 'ft';
	createdAt: string;
	updatedAt: string;
	role: ProjectRole;
}

export function projectView(p: Project, role: ProjectRole): ProjectView {
	return {
		id: p.id,
		name: p.name,
		description: p.description,
		lengthUnit: p.lengthUnit,
		createdAt: p.createdAt.toISOString(),
		updatedAt: p.updatedAt.toISOString(),
		role
	};
}

/** The projects the user is a member of, by name. */
export function listProjectsForUser(userId: string): ProjectView[] {
	return getDb()
		.select({ project: projects, role: memberships.role })
		.from(memberships)
		.innerJoin(projects, eq(projects.id, memberships.projectId))
		.where(eq(memberships.userId, userId))
		.orderBy(asc(projects.name))
		.all()
		.map((r) => projectView(r.project, r.role));
}

/** Creates a project with its creator as owner, in one transaction. */
export function createProject(userId: string, input: ProjectCreate): ProjectView {
	return getDb().transaction((tx) => {
		const project = tx
			.insert(projects)
			.values({ name: input.name, description: input.description, lengthUnit: input.lengthUnit, createdBy: userId })
			.returning()
			.get();
		tx.insert(memberships).values({ projectId: project.id, userId, role: 'owner' }).run();
		recordAudit(tx, { projectId: project.id, kind: 'site', action: 'created', subject: `Project ${input.name}`, detail: 'as its owner', userId });
		return projectView(project, 'owner');
	});
}

export function updateProject(project: Project, role: ProjectRole, input: ProjectUpdate): ProjectView {
	const values = Object.fromEntries(Object.entries(input).filter(([, v]) => v !== undefined));
	const updated = getDb().transaction((tx) => {
		const row = tx
			.update(projects)
			.set({ ...values, updatedAt: new Date() })
			.where(eq(projects.id, project.id))
			.returning()
			.get();
		const detail = Object.entries(values)
			.filter(([k, v]) => v !== project[k as keyof Project])
			.map(([k, v]) => `${k}: ${JSON.stringify(project[k as keyof Project])} → ${JSON.stringify(v)}`)
			.join('; ');
		recordAudit(tx, { projectId: project.id, kind: 'site', action: 'changed', subject: 'Project settings', detail });
		return row;
	});
	return projectView(updated, role);
}

/** Deletes a project; memberships, invitations and everything project-scoped go with it (ON DELETE CASCADE). */
export function deleteProject(projectId: string): void {
	getDb().delete(projects).where(eq(projects.id, projectId)).run();
}
