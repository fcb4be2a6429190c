import { describe, expect, it } from 'vitest';
import { initialAdminEmail, seedDemoEnabled } from '$lib/server/config';

describe('seedDemoEnabled(env)', () => {
	it('is off unless SEED_DEMO says so: a bare start seeds no public demo passwords', () => {
		expect(seedDemoEnabled({})).toBe(false);
		for (const off of ['', '0', 'false', 'no', 'off', 'maybe']) expect(seedDemoEnabled({ SEED_DEMO: off }), off).toBe(false);
		for (const on of ['1', 'true', 'TRUE', 'yes', 'on', ' 1 ']) expect(seedDemoEnabled({ SEED_DEMO: on }), on).toBe(true);
	});
});

describe('initialAdminEmail(env)', () => {
	it('is the trimmed, lower-cased ADMIN_EMAIL, or null', () => {
		expect(initialAdminEmail({})).toBeNull();
		expect(initialAdminEmail({ ADMIN_EMAIL: '  ' })).toBeNull();
		expect(initialAdminEmail({ ADMIN_EMAIL: ' Boss@Example.COM ' })).toBe('boss@example.com');
	});
});
