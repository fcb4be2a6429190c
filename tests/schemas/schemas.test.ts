import { describe, expect, it } from 'vitest';
import {
	acceptInvitationSchema,
	apiTokenCreateSchema,
	changePasswordSchema,
	email,
	inviteSchema,
	magicLinkSchema,
	memberRoleSchema,
	projectCreateSchema,
	projectUpdateSchema,
	signInFormSchema
} from '$lib/schemas';

describe('email', () => {
	it('email.parse(x) trims and lower-cases', () => {
		expect(email.parse('  Owner@Conefield.TEST ')).toBe('owner@conefield.test');
	});

	it('email rejects a missing @, an empty string and a non-string', () => {
		for (const bad of ['owner.conefield.test', '', '   ', 42, null]) expect(email.safeParse(bad).success).toBe(false);
	});

	it('email rejects an address longer than 254 characters (RFC 5321 path limit)', () => {
		expect(email.safeParse(`${'a'.repeat(64)}@${'b'.repeat(186)}.test`).success).toBe(false);
	});
});

describe('projectCreateSchema', () => {
	it('fills description "" and lengthUnit "m" by default and trims the name', () => {
		expect(projectCreateSchema.parse({ name: '  Levee  ' })).toEqual({ name: 'Levee', description: '', lengthUnit: 'm' });
	});

	it('accepts ft and rejects other units with the message shown on the form', () => {
		expect(projectCreateSchema.parse({ name: 'A', lengthUnit: 'ft' }).lengthUnit).toBe('ft');
		const r = projectCreateSchema.safeParse({ name: 'A', lengthUnit: 'yd' });
		expect(r.success).toBe(false);
		expect(r.error?.issues[0].message).toBe('Choose metres (m) or feet (ft).');
	});

	it('rejects an empty or whitespace name and one over 120 characters', () => {
		expect(projectCreateSchema.safeParse({ name: '   ' }).success).toBe(false);
		expect(projectCreateSchema.safeParse({ name: 'x'.repeat(121) }).success).toBe(false);
		expect(projectCreateSchema.safeParse({ name: 'x'.repeat(120) }).success).toBe(true);
	});
});

describe('projectUpdateSchema', () => {
	it('accepts a partial update without filling defaults for absent fields', () => {
		expect(projectUpdateSchema.parse({ name: 'B' })).toEqual({ name: 'B' });
	});

	it('rejects an empty update', () => {
		expect(projectUpdateSchema.safeParse({}).success).toBe(false);
	});
});

describe('signInFormSchema / magicLinkSchema', () => {
	it('keeps a same-site redirect and replaces an off-site or protocol-relative one by /projects', () => {
		const base = { email: 'a@b.test', password: 'x' };
		expect(signInFormSchema.parse({ ...base, redirectTo: '/projects/1/team' }).redirectTo).toBe('/projects/1/team');
		expect(signInFormSchema.parse({ ...base, redirectTo: 'https://evil.test/' }).redirectTo).toBe('/projects');
		expect(signInFormSchema.parse({ ...base, redirectTo: '//evil.test/' }).redirectTo).toBe('/projects');
		expect(magicLinkSchema.parse({ email: 'a@b.test' }).redirectTo).toBe('/projects');
	});

	it('requires a password', () => {
		expect(signInFormSchema.safeParse({ email: 'a@b.test', password: '' }).success).toBe(false);
	});
});

describe('password schemas', () => {
	it('changePasswordSchema needs 10+ characters and a matching confirmation, reported on confirm', () => {
		expect(changePasswordSchema.safeParse({ current: 'old', password: 'short', confirm: 'short' }).success).toBe(false);
		const mismatch = changePasswordSchema.safeParse({ current: 'old', password: 'long-enough-1', confirm: 'long-enough-2' });
		expect(mismatch.success).toBe(false);
		expect(mismatch.error?.issues[0].path).toEqual(['confirm']);
		expect(changePasswordSchema.safeParse({ current: 'old', password: 'long-enough-1', confirm: 'long-enough-1' }).success).toBe(true);
	});

	it('acceptInvitationSchema needs a name', () => {
		expect(acceptInvitationSchema.safeParse({ name: ' ', password: 'long-enough-1', confirm: 'long-enough-1' }).success).toBe(false);
	});
});

describe('member and token schemas', () => {
	it('inviteSchema takes the four roles only', () => {
		for (const role of ['viewer', 'reviewer', 'analyst', 'owner']) expect(inviteSchema.safeParse({ email: 'a@b.test', role }).success).toBe(true);
		expect(inviteSchema.safeParse({ email: 'a@b.test', role: 'admin' }).success).toBe(false);
		expect(memberRoleSchema.safeParse({ userId: '', role: 'viewer' }).success).toBe(false);
	});

	it('apiTokenCreateSchema coerces the form string "30" and allows 7, 30, 90 or 365 days only', () => {
		expect(apiTokenCreateSchema.parse({ name: 'ci', expiresInDays: '30' })).toEqual({ name: 'ci', expiresInDays: 30 });
		for (const d of [0, 1, 31, 366, -7, 'x']) expect(apiTokenCreateSchema.safeParse({ name: 'ci', expiresInDays: d }).success).toBe(false);
		expect(apiTokenCreateSchema.safeParse({ name: '', expiresInDays: 7 }).success).toBe(false);
	});
});
