import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { eq } from 'drizzle-orm';
import { getDb } from '$lib/server/db';
import { outbox, users } from '$lib/server/db/schema';
import { closeMail } from '$lib/server/mail';
import { createUser, ensureInitialAdmin, findUserByEmail, resetPassword } from '$lib/server/services/users';

const ORIGIN = 'https://conefield.example';
const mailsTo = (to: string) => getDb().select().from(outbox).where(eq(outbox.to, to)).all();

beforeAll(() => {
	process.env.DATABASE_URL = ':memory:';
	delete process.env.SMTP_URL;
});
afterAll(() => closeMail());

describe('ensureInitialAdmin(email, origin)', () => {
	it('creates a site administrator without a password and mails a link to choose one, again at each start until it is used', async () => {
		await ensureInitialAdmin('boss@example.test', ORIGIN);
		const admin = findUserByEmail('boss@example.test')!;
		expect(admin).toMatchObject({ siteRole: 'admin', passwordHash: null, disabled: false });
		await expect.poll(() => mailsTo('boss@example.test').length).toBe(1);
		await ensureInitialAdmin('boss@example.test', ORIGIN);
		await expect.poll(() => mailsTo('boss@example.test').length).toBe(2);
		const link = /https:\/\/conefield\.example\/reset-password\/(\S+)/.exec(mailsTo('boss@example.test')[1].text)!;
		await resetPassword(decodeURIComponent(link[1]), 'a-strong-admin-password');
		await ensureInitialAdmin('boss@example.test', ORIGIN);
		expect(mailsTo('boss@example.test')).toHaveLength(2);
		expect(getDb().select().from(users).where(eq(users.email, 'boss@example.test')).all()).toHaveLength(1);
	});

	it('leaves an existing member account with that address as it is', async () => {
		await createUser({ email: 'member@example.test', name: 'Member', password: 'member-password-1' });
		await ensureInitialAdmin('member@example.test', ORIGIN);
		expect(findUserByEmail('member@example.test')!.siteRole).toBe('member');
		expect(mailsTo('member@example.test')).toHaveLength(0);
	});
});
