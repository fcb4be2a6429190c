// Issue 11, Low 8 and Medium 5: input the schemas must refuse.
import { describe, expect, it } from 'vitest';
import { apiTokenCreateSchema, projectCreateSchema, acceptInvitationSchema } from '$lib/schemas';
import { hasVisibleCharacter } from '$lib/schemas/common';
import { siteUpdateSchema, contactPutSchema, unitCreateSchema } from '$lib/schemas/stratigraphy';
import { uploadOptionsSchema } from '$lib/schemas/soundings';

describe('apiTokenCreateSchema.expiresInDays', () => {
	it('takes a number of the offered lifetimes, or its digits from a form, and nothing else', () => {
		for (const ok of [7, 30, '90', '365']) expect(apiTokenCreateSchema.safeParse({ name: 't', expiresInDays: ok }).success, String(ok)).toBe(true);
		for (const bad of [[7], ['7'], true, '7 days', ' 7', '7.0', 8, null, { valueOf: () => 7 }]) {
			expect(apiTokenCreateSchema.safeParse({ name: 't', expiresInDays: bad }).success, JSON.stringify(bad)).toBe(false);
		}
	});
});

describe('names people read', () => {
	it('hasVisibleCharacter is false for spaces, zero-width, bidi and filler characters only', () => {
		for (const s of ['\u200b', '\u200b\u200c\u200d', '\u2060\ufeff', ' \u00a0\u3000', '\u202e\u202d', '\u3164', '\u2800', '\u115f\u1160', '']) expect(hasVisibleCharacter(s), JSON.stringify(s)).toBe(false);
		for (const s of ['a', '\u200bA', 'é', '堤防', '–']) expect(hasVisibleCharacter(s), s).toBe(true);
	});

	it('a project, unit or account name of zero-width characters only is refused', () => {
		expect(projectCreateSchema.safeParse({ name: '\u200b\u200b' }).success).toBe(false);
		expect(projectCreateSchema.safeParse({ name: '' }).error?.issues).toHaveLength(1);
		expect(projectCreateSchema.safeParse({ name: 'Levee \u200b' }).success).toBe(true);
		expect(unitCreateSchema.safeParse({ name: '\u2060' }).success).toBe(false);
		expect(acceptInvitationSchema.safeParse({ name: '\ufeff', password: 'long-enough-1', confirm: 'long-enough-1' }).success).toBe(false);
		expect(apiTokenCreateSchema.safeParse({ name: '\u200d', expiresInDays: 7 }).success).toBe(false);
	});
});

describe('bounds', () => {
	it('siteUpdateSchema refuses section-line points beyond ±1e8 and groundwater beyond ±30 000', () => {
		expect(siteUpdateSchema.safeParse({ sectionLine: [[0, 0], [1e8, -1e8]] }).success).toBe(true);
		expect(siteUpdateSchema.safeParse({ sectionLine: [[0, 0], [1e308, 1e308]] }).success).toBe(false);
		expect(siteUpdateSchema.safeParse({ groundwaterElevation: 30_001 }).success).toBe(false);
	});

	it('contacts and upload fallbacks keep elevations within ±30 000; mapping constants coordinates within ±1e8', () => {
		expect(contactPutSchema.safeParse({ soundingId: 's', unitId: 'u', topElevation: -1e5 }).success).toBe(false);
		expect(uploadOptionsSchema.safeParse({ defaults: { groundElevation: 1e160 } }).success).toBe(false);
		const mapping = { depth: 'd', qc: 'q', fs: 'f', units: { depth: 'm', qc: 'MPa', fs: 'kPa' } };
		expect(uploadOptionsSchema.safeParse({ mapping: { ...mapping, x: { value: 5e5 } } }).success).toBe(true);
		expect(uploadOptionsSchema.safeParse({ mapping: { ...mapping, x: { value: 1e160 } } }).success).toBe(false);
	});
});
