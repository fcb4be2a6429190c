import { PROJECT_ROLES, type ProjectRole } from '$lib/server/db/schema';

export { PROJECT_ROLES, type ProjectRole };

/**
 * What each project role may do: a role (that role or any above it) or a list (exactly those roles). A role may
 * do everything the roles below it may do, except what a list names: the audit log is for oversight, read by the
 * project's reviewers and its owners, not by the analysts whose work it records (issue 13).
 *
 * | role     | may                                                        |
 * |----------|------------------------------------------------------------|
 * | viewer   | read, download                                             |
 * | reviewer | + comment, approve, read the audit log                     |
 * | analyst  | + edit data, models and recipes (the audit log: no)        |
 * | owner    | + edit project settings, manage members, delete; audit log |
 */
export const CAPABILITIES = {
	read: 'viewer',
	download: 'viewer',
	comment: 'reviewer',
	approve: 'reviewer',
	readAudit: ['reviewer', 'owner'],
	editData: 'analyst',
	editModels: 'analyst',
	editRecipes: 'analyst',
	editProject: 'owner',
	manageMembers: 'owner',
	deleteProject: 'owner'
} as const satisfies Record<string, RoleRequirement>;

/** Who may do something: a role and those above it, or exactly the roles listed. */
export type RoleRequirement = ProjectRole | readonly ProjectRole[];

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

/** True when `role` meets `required`: at or above it, or one of the roles it lists. */
export function meets(role: ProjectRole, required: RoleRequirement): boolean {
	return typeof required === 'string' ? hasRole(role, required) : required.includes(role);
}

/** In words, for a refusal: "the analyst role or higher", "the reviewer or owner role". */
export function describeRequirement(required: RoleRequirement): string {
	return typeof required === 'string' ? `the ${required} role or higher` : `the ${required.join(' or ')} role`;
}

/** True when `role` may exercise `capability`. */
export function can(role: ProjectRole, capability: Capability): boolean {
	return meets(role, CAPABILITIES[capability]);
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
 * (the project's existence is not revealed); member who does not meet `required` → forbidden.
 */
export function decideAccess(
	signedIn: boolean,
	membershipRole: ProjectRole | null | undefined,
	required: RoleRequirement
): AccessDecision {
	if (!signedIn) return 'unauthenticated';
	if (!membershipRole) return 'not_found';
	return meets(membershipRole, required) ? 'allow' : 'forbidden';
}
