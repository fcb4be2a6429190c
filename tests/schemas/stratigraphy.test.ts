import { describe, expect, it } from 'vitest';
import { contactsPatchSchema, MAX_CONTACT_EDITS, unitCreateSchema } from '../../src/lib/schemas/stratigraphy';

describe('unitCreateSchema', () => {
	it('unitCreateSchema asks for the property, saying which suits sands and which clays', () => {
		const r = unitCreateSchema.safeParse({ name: 'Soft clay' });
		expect(r.success).toBe(false);
		expect(r.error?.issues.map((i) => [i.path, i.message])).toEqual([
			[['property'], expect.stringMatching(/^Choose the property to simulate the unit in \(qc1Ncs for sands, suRatio for clays; any of qc1Ncs, suRatio/)]
		]);
		expect(unitCreateSchema.parse({ name: ' Soft clay ', property: 'suRatio' })).toEqual({ name: 'Soft clay', property: 'suRatio' });
	});

	it('unitCreateSchema keeps the other fields optional and refuses unknown ones', () => {
		expect(unitCreateSchema.parse({ name: 'Sand', property: 'qc1Ncs', nkt: 15 })).toEqual({ name: 'Sand', property: 'qc1Ncs', nkt: 15 });
		expect(unitCreateSchema.safeParse({ name: 'Sand', property: 'qc1Ncs', depth: 3 }).success).toBe(false);
		expect(unitCreateSchema.safeParse({ property: 'qc1Ncs' }).success).toBe(false);
	});
});

describe('contactsPatchSchema', () => {
	const c = { soundingId: 's', unitId: 'u', topElevation: 1.5 };

	it('contactsPatchSchema fills empty lists and needs at least one edit', () => {
		expect(contactsPatchSchema.parse({ set: [c] })).toEqual({ set: [c], remove: [], interpolate: [] });
		expect(contactsPatchSchema.safeParse({}).error?.issues[0].message).toBe('Nothing to change: give set, remove or interpolate.');
	});

	it('contactsPatchSchema refuses non-finite tops, unknown keys and more than MAX_CONTACT_EDITS edits', () => {
		expect(contactsPatchSchema.safeParse({ set: [{ ...c, topElevation: Infinity }] }).success).toBe(false);
		expect(contactsPatchSchema.safeParse({ set: [{ ...c, interpolated: true }] }).success).toBe(false);
		expect(contactsPatchSchema.safeParse({ remove: Array.from({ length: MAX_CONTACT_EDITS + 1 }, () => ({ soundingId: 's', unitId: 'u' })) }).success).toBe(false);
		expect(contactsPatchSchema.safeParse({ interpolate: [''] }).success).toBe(false);
	});
});
