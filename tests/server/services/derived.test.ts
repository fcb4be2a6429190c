import { describe, expect, it } from 'vitest';
import { deriveWithContext, derivedJson, jsonColumn, type DeriveContext } from '../../../src/lib/server/services/derived';
import { toFloat64Blob } from '../../../src/lib/server/db/float64';
import type { Sounding, Unit } from '../../../src/lib/server/db/site-schema';
import { expectAbsClose } from '../../asserts';

function unit(id: string, position: number, gammaAbove: number, gammaBelow: number): Unit {
	return {
		id,
		projectId: 'p',
		name: id,
		colour: '#888888',
		position,
		gammaAbove,
		gammaBelow,
		nkt: 14,
		cfc: 0,
		property: 'qc1Ncs',
		zoneNames: null,
		createdAt: new Date(0)
	};
}

function sounding(over: Partial<Sounding> = {}): Sounding {
	const depth = [0.5, 1, 1.5, 2, 3];
	return {
		id: 's1',
		projectId: 'p',
		sourceFileId: null,
		name: 'T-1',
		x: null,
		y: null,
		chainage: 40,
		groundElevation: 0,
		areaRatio: 0.8,
		groundwaterElevation: null,
		readings: depth.length,
		maxDepth: 3,
		maxQc: 5000,
		depth: toFloat64Blob(depth),
		qc: toFloat64Blob(depth.map(() => 5000)),
		fs: toFloat64Blob(depth.map(() => 50)),
		u2: toFloat64Blob(depth.map(() => 20)),
		extras: null,
		contactsEdited: false,
		createdAt: new Date(0),
		...over
	};
}

const site = { geometry: '2d' as const, sectionLine: null, offLineTolerance: 25, groundwaterElevation: -1.5, lengthUnit: 'm' as const };
const A = unit('A', 0, 17, 18);
const B = unit('B', 1, 18, 20);

function ctx(tops: Record<string, number>, over: Partial<DeriveContext> = {}, interpolated: string[] = []): DeriveContext {
	const stored = new Map(Object.entries(tops).map(([u, top]) => [u, { top, interpolated: interpolated.includes(u) }]));
	return { site, units: [A, B], contacts: new Map([['s1', stored]]), ...over };
}

describe('deriveWithContext(sounding, context)', () => {
	it('deriveWithContext(s, ctx) integrates the unit weights of the contacts and the project groundwater', () => {
		// Ground 0, A from 0 (γ 17 above water), B from −1 (γ 18 above, 20 below), water at −1.5 (worked by hand):
		// σv(−2) = 17·1 + 18·0.5 + 20·0.5 = 36 kPa; u0 = 9.81·0.5 = 4.905 kPa; σv(−3) = 36 + 20 = 56 kPa.
		const r = deriveWithContext(sounding(), ctx({ A: 0, B: -1 }));
		expectAbsClose(r.derived.sigmaV[3], 36, 1e-9, 'σv at 2 m');
		expectAbsClose(r.derived.u0[3], 4.905, 1e-9, 'u0 at 2 m');
		expectAbsClose(r.derived.sigmaV[4], 56, 1e-9, 'σv at 3 m');
		// A reading exactly at a contact belongs to the unit below it (the unit whose top is at or above it).
		expect(Array.from(r.unit)).toEqual([0, 1, 1, 1, 1]);
		expect(r.sounding.groundwaterSource).toBe('project');
		expect(r.sounding.chainage).toBe(40);
		expect(r.warnings).toEqual([]);
		// qt = qc + u2(1 − a) (Lunne et al. 1997): 5000 + 20·0.2.
		expectAbsClose(r.derived.qt[0], 5004, 1e-9, 'qt');
	});

	it('deriveWithContext(s, ctx) uses the sounding override of the groundwater elevation', () => {
		const r = deriveWithContext(sounding({ groundwaterElevation: 0 }), ctx({ A: 0, B: -1 }));
		expect(r.sounding.groundwaterSource).toBe('sounding');
		// Water at ground: u0(−2) = 9.81·2.
		expectAbsClose(r.derived.u0[3], 19.62, 1e-9, 'u0');
	});

	it('deriveWithContext(s, ctx) assumes water at the ground surface, with a warning, when none is set', () => {
		const r = deriveWithContext(sounding(), ctx({ A: 0, B: -1 }, { site: { ...site, groundwaterElevation: null } }));
		expect(r.sounding.groundwaterSource).toBe('assumed');
		expect(r.sounding.groundwaterElevation).toBe(0);
		expect(r.warnings.join(' ')).toMatch(/assumed at the ground surface/);
	});

	it('deriveWithContext(s, ctx) starts the top unit at the ground surface where no top is stored for it', () => {
		// A not stored: it starts at the ground (0); B's top at −1.2 takes the readings from 1.5 m down.
		const r = deriveWithContext(sounding(), ctx({ B: -1.2 }));
		expect(Array.from(r.unit)).toEqual([0, 0, 1, 1, 1]);
		expect(r.units.map((u) => [u.topElevation, u.topSource])).toEqual([
			[0, 'ground'],
			[-1.2, 'measured']
		]);
	});

	it('deriveWithContext(s, ctx) marks readings above a top unit entered below the ground surface, and interpolated tops', () => {
		const r = deriveWithContext(sounding(), ctx({ A: -0.8, B: -1.2 }, {}, ['B']));
		expect(Array.from(r.unit)).toEqual([-1, 0, 1, 1, 1]);
		expect(r.units.map((u) => u.topSource)).toEqual(['measured', 'interpolated']);
	});

	it('deriveWithContext(s, ctx) gives the top unit no thickness where the next one is entered at the ground surface', () => {
		const r = deriveWithContext(sounding(), ctx({ B: 0 }));
		expect(Array.from(r.unit)).toEqual([1, 1, 1, 1, 1]);
		expect(r.warnings).toEqual([]);
	});

	it('deriveWithContext(s, ctx) takes contacts out of stacking order by elevation and says so', () => {
		const r = deriveWithContext(sounding(), ctx({ A: -1, B: 0 }));
		expect(Array.from(r.unit)).toEqual([1, 0, 0, 0, 0]);
		expect(r.warnings.join(' ')).toMatch(/out of stacking order/);
	});

	it('deriveWithContext(s, ctx) takes a sounding without contacts as the top unit and says so', () => {
		// A (17 above, 18 below the water at −1.5) from the ground down: σv(−2) = 17·1.5 + 18·0.5 = 34.5 kPa (worked by hand).
		const r = deriveWithContext(sounding(), ctx({}));
		expect(Array.from(r.unit)).toEqual([0, 0, 0, 0, 0]);
		expectAbsClose(r.derived.sigmaV[3], 34.5, 1e-9, 'σv');
		expect(r.warnings.join(' ')).toMatch(/T-1 has no contacts: all of it is taken as A/);
	});

	it('deriveWithContext(s, ctx) falls back to default unit weights when the project has no units', () => {
		// 18 above and 19 below the water at −1.5: σv(−2) = 18·1.5 + 19·0.5 = 36.5 kPa (worked by hand).
		const r = deriveWithContext(sounding(), ctx({}, { units: [] }));
		expect(Array.from(r.unit)).toEqual([-1, -1, -1, -1, -1]);
		expectAbsClose(r.derived.sigmaV[3], 36.5, 1e-9, 'σv');
		expect(r.warnings).toEqual([]);
	});

	it('deriveWithContext(s, ctx) reads a measured fines content from an extra column', () => {
		const fc = [10, 20, 30, NaN, 40];
		const r = deriveWithContext(
			sounding({ extras: { FC: toFloat64Blob(fc).toString('base64') } }),
			ctx({ A: 0, B: -1 })
		);
		expect(Array.from(r.derived.FC.subarray(0, 3))).toEqual([10, 20, 30]);
		expect(r.derived.FC[4]).toBe(40);
	});

	it('jsonColumn(values) and derivedJson(result) turn NaN and Infinity into null', () => {
		expect(jsonColumn(new Float64Array([1, NaN, Infinity, -2]))).toEqual([1, null, null, -2]);
		const j = derivedJson(deriveWithContext(sounding(), ctx({ A: 0, B: -1 })));
		expect(j.unit).toBeUndefined();
		expect(j.qt.length).toBe(5);
		expect(JSON.parse(JSON.stringify(j)).qt[0]).toBe(5004);
	});
});
