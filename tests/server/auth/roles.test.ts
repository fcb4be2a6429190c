import { describe, expect, it } from 'vitest';
import {
	CAPABILITIES,
	PROJECT_ROLES,
	can,
	capabilitiesOf,
	decideAccess,
	describeRequirement,
	hasRole,
	meets,
	isProjectRole,
	roleRank,
	type Capability,
	type ProjectRole
} from '$lib/server/auth/roles';

/** The capability table of the README and roles.ts, written out by hand: role → what it may do. */
const TABLE: Record<ProjectRole, Capability[]> = {
	viewer: ['read', 'download'],
	reviewer: ['read', 'download', 'comment', 'approve', 'readAudit'],
	// The audit log is for oversight: reviewers and owners read it, the analysts whose work it records do not.
	analyst: ['read', 'download', 'comment', 'approve', 'editData', 'editModels', 'editRecipes'],
	owner: ['read', 'download', 'comment', 'approve', 'readAudit', 'editData', 'editModels', 'editRecipes', 'editProject', 'manageMembers', 'deleteProject']
};

describe('project roles', () => {
	it('PROJECT_ROLES is ordered viewer < reviewer < analyst < owner', () => {
		expect(PROJECT_ROLES).toEqual(['viewer', 'reviewer', 'analyst', 'owner']);
		expect(PROJECT_ROLES.map(roleRank)).toEqual([0, 1, 2, 3]);
	});

	it('roleRank of an unknown role throws RangeError', () => {
		expect(() => roleRank('admin' as ProjectRole)).toThrow(RangeError);
	});

	it('isProjectRole(x) accepts exactly the four roles', () => {
		for (const r of PROJECT_ROLES) expect(isProjectRole(r)).toBe(true);
		for (const x of ['admin', 'Owner', '', null, 3]) expect(isProjectRole(x)).toBe(false);
	});

	it('hasRole(role, min) holds exactly when role is at or above min, for all 16 pairs', () => {
		for (const [i, role] of PROJECT_ROLES.entries()) {
			for (const [j, min] of PROJECT_ROLES.entries()) expect(hasRole(role, min), `${role} ≥ ${min}`).toBe(i >= j);
		}
	});

	it('can(role, capability) matches the documented table for every role × capability', () => {
		const all = Object.keys(CAPABILITIES) as Capability[];
		expect(all.sort()).toEqual([...new Set(Object.values(TABLE).flat())].sort());
		for (const role of PROJECT_ROLES) {
			for (const cap of all) expect(can(role, cap), `${role} ${cap}`).toBe(TABLE[role].includes(cap));
		}
	});

	it('capabilitiesOf(role) lists every capability with can(role, c)', () => {
		for (const role of PROJECT_ROLES) {
			const caps = capabilitiesOf(role);
			expect(Object.entries(caps).filter(([, v]) => v).map(([k]) => k).sort()).toEqual([...TABLE[role]].sort());
		}
	});
});

describe('decideAccess(signedIn, membershipRole, minRole)', () => {
	it('is unauthenticated for nobody, whatever the role asked', () => {
		for (const min of PROJECT_ROLES) expect(decideAccess(false, 'owner', min)).toBe('unauthenticated');
	});

	it('is not_found for a signed-in non-member, so the project is not revealed', () => {
		for (const min of PROJECT_ROLES) {
			expect(decideAccess(true, null, min)).toBe('not_found');
			expect(decideAccess(true, undefined, min)).toBe('not_found');
		}
	});

	it('allows at or above the minimum and forbids below it, for every role × minimum', () => {
		for (const role of PROJECT_ROLES) {
			for (const min of PROJECT_ROLES) {
				expect(decideAccess(true, role, min)).toBe(roleRank(role) >= roleRank(min) ? 'allow' : 'forbidden');
			}
		}
	});
});

describe('a requirement that lists roles (meets, decideAccess, describeRequirement)', () => {
	it('meets(role, list) holds for exactly the listed roles, not for the roles between them', () => {
		for (const role of PROJECT_ROLES) expect(meets(role, ['reviewer', 'owner']), role).toBe(role === 'reviewer' || role === 'owner');
		expect(PROJECT_ROLES.filter((r) => meets(r, []))).toEqual([]);
	});

	it('decideAccess with a list: allow for a listed role, forbidden for another member, not_found and unauthenticated as before', () => {
		expect(PROJECT_ROLES.map((r) => decideAccess(true, r, CAPABILITIES.readAudit))).toEqual(['forbidden', 'allow', 'forbidden', 'allow']);
		expect(decideAccess(true, null, CAPABILITIES.readAudit)).toBe('not_found');
		expect(decideAccess(false, 'owner', CAPABILITIES.readAudit)).toBe('unauthenticated');
	});

	it('describeRequirement words a least role and a list for the 403 message', () => {
		expect(describeRequirement('analyst')).toBe('the analyst role or higher');
		expect(describeRequirement(['reviewer', 'owner'])).toBe('the reviewer or owner role');
	});
});
