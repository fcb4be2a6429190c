import { PROJECT_ROLES, type ProjectRole } from '$lib/server/db/schema';

export { PROJECT_ROLES, type ProjectRole };

/**
 * What each project role may do. A role may do everything the roles below it may do.
 *
 * | role     | may                                              |
 * |----------|--------------------------------------------------|
 * | viewer   | read, download                                   |
 * | reviewer | + comment, approve, read the audit log           |
 * | analyst  | + edit data, models and recipes                  |
 * | owner    | + edit project settings, manage members, delete  |
 */
export const CAPABILITIES = {
	read: 'viewer',
	download: 'viewer',
	comment: 'reviewer',
	approve: 'reviewer',
	readAudit: 'reviewer',
	editData: 'analyst',
	editModels: 'analyst',
	editRecipes: 'analyst',
	editProject: 'owner',
	manageMembers: 'owner',
	deleteProject: 'owner'
} as const satisfies Record<string, ProjectRole>;

export type Capability = keyof typeof CAPABILITIES;

export function isProjectRole(value: unknown): value is ProjectRole {
	return typeof value === 'string' && (PROJECT_ROLES as readonly string[]).includes(value);
}

/** Rank of a role in PROJECT_ROLES: viewer 0 < reviewer 1 < analyst 2 < owner 3. */
export function roleRank(role: ProjectRole): number {
	const rank = PROJECT_ROLES.indexOf(role);
	if (rank < 0) throw new RangeError(`unknown project role: ${String(role)}`);
	return rank;
}

/** True when `role` is at least `minRole`. */
export function hasRole(role: ProjectRole, minRole: ProjectRole): boolean {
	return roleRank(role) >= roleRank(minRole);
}

/** True when `role` may exercise `capability`. */
export function can(role: ProjectRole, capability: Capability): boolean {
	return hasRole(role, CAPABILITIES[capability]);
}

/** Every capability of a role, for the client to show or hide controls (the server still checks). */
export function capabilitiesOf(role: ProjectRole): Record<Capability, boolean> {
	return Object.fromEntries(
		(Object.keys(CAPABILITIES) as Capability[]).map((c) => [c, can(role, c)])
	) as Record<Capability, boolean>;
}

export type AccessDecision = 'allow' | 'unauthenticated' | 'not_found' | 'forbidden';

/**
 * The whole access rule in one place: no user → unauthenticated; not a member → not_found
 * (the project's existence is not revealed); member below `minRole` → forbidden.
 */
export function decideAccess(
	signedIn: boolean,
	membershipRole: ProjectRole | null | undefined,
	minRole: ProjectRole
): AccessDecision {
	if (!signedIn) return 'unauthenticated';
	if (!membershipRole) return 'not_found';
	return hasRole(membershipRole, minRole) ? 'allow' : 'forbidden';
}
