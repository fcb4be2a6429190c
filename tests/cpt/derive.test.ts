import { describe, expect, it } from 'vitest';
import {
	CptFlag,
	GAMMA_W,
	crrBI2014,
	derive,
	describeFlags,
	finesContentFromIc,
	qc1NcsBI2014,
	relativeDensityIB2008,
	robertson2009
} from '$lib/cpt';
import type { UnitAtSounding } from '$lib/cpt';
import { expectAbsClose, expectRelClose } from '../asserts';

const col = (v: number[]) => Float64Array.from(v);

// Two units: A (17 above / 18 below water) from the ground at 0 m, B (19 / 20) from −3 m; water at −1 m.
const twoUnits: UnitAtSounding[] = [
	{ topElevation: 0, gammaAbove: 17, gammaBelow: 18, Nkt: 12 },
	{ topElevation: -3, gammaAbove: 19, gammaBelow: 20, CFC: 0.1 }
];

describe('derive(sounding, options)', () => {
	it('derive(sounding, options) integrates σv over units and the water table to hand-worked values', () => {
		const s = { depth: col([0.5, 2, 3.5, 5]), qc: col([3000, 3000, 8000, 8000]), fs: col([40, 40, 60, 60]), groundElevation: 0 };
		const d = derive(s, { units: twoUnits, groundwaterElevation: -1 });
		// σv by hand: 0.5·17 = 8.5; 17·1 + 18·1 = 35; 17 + 18·2 + 20·0.5 = 63; 17 + 36 + 20·2 = 93 kPa.
		const sv = [8.5, 35, 63, 93];
		const u0 = [0, 1, 2.5, 4].map((h) => h * 9.81);
		for (let i = 0; i < 4; i++) {
			expectAbsClose(d.sigmaV[i], sv[i], 1e-9, `σv[${i}]`);
			expectAbsClose(d.u0[i], u0[i], 1e-9, `u0[${i}]`);
			expectAbsClose(d.sigmaVeff[i], sv[i] - u0[i], 1e-9, `σ'v[${i}]`);
		}
		expect(Array.from(d.unit)).toEqual([0, 0, 1, 1]);
		expect(Array.from(d.elevation)).toEqual([-0.5, -2, -3.5, -5]);
		expect(d.flags[0] & CptFlag.aboveWaterTable).toBeTruthy();
		expect(d.flags[1] & CptFlag.aboveWaterTable).toBe(0);
	});

	it('derive(sounding, options) gives a linear σv in one uniform unit (trapezoid exact)', () => {
		const depth = Array.from({ length: 50 }, (_, i) => 0.1 + i * 0.1);
		const s = { depth: col(depth), qc: col(depth.map(() => 5000)), fs: col(depth.map(() => 50)), groundElevation: 10 };
		const d = derive(s, { units: [{ topElevation: 10, gammaAbove: 19, gammaBelow: 19 }], groundwaterElevation: 8 });
		for (let i = 0; i < depth.length; i++) expectAbsClose(d.sigmaV[i], 19 * depth[i], 1e-9, `σv[${i}]`);
	});

	it('derive(sounding, options) loads the ground with water ponded above it', () => {
		const s = { depth: col([1, 2]), qc: col([2000, 2000]), fs: col([20, 20]), groundElevation: 0 };
		const d = derive(s, { units: [{ topElevation: 0, gammaAbove: 18, gammaBelow: 19.81 }], groundwaterElevation: 1 });
		// σv = γw·1 + 19.81·z, u0 = γw(1 + z), σ'v = (19.81 − 9.81)·z = 10·z.
		expectAbsClose(d.sigmaV[1], GAMMA_W + 19.81 * 2, 1e-9);
		expectAbsClose(d.u0[1], GAMMA_W * 3, 1e-9);
		expectAbsClose(d.sigmaVeff[0], 10, 1e-9);
		expectAbsClose(d.sigmaVeff[1], 20, 1e-9);
	});

	it('derive(sounding, options) composes the published correlations reading by reading', () => {
		const s = {
			depth: col([1.5, 2.5, 4, 6]),
			qc: col([600, 900, 9000, 12000]),
			fs: col([15, 20, 60, 70]),
			u2: col([40, 80, 30, 50]),
			groundElevation: 0,
			areaRatio: 0.75
		};
		const d = derive(s, { units: twoUnits, groundwaterElevation: -1 });
		for (let i = 0; i < 4; i++) {
			const unit = twoUnits[d.unit[i]];
			const qt = s.qc[i] + s.u2[i] * 0.25;
			expectAbsClose(d.qt[i], qt, 1e-9, `qt[${i}]`);
			const r = robertson2009({ qt, fs: s.fs[i], sigmaV: d.sigmaV[i], sigmaVeff: d.sigmaVeff[i] });
			expect(d.Ic[i]).toBe(r.Ic);
			expect(d.n[i]).toBe(r.n);
			expect(d.Qtn[i]).toBe(r.Qtn);
			expect(d.Fr[i]).toBe(r.Fr);
			const FC = finesContentFromIc(r.Ic, unit.CFC ?? 0);
			expect(d.FC[i]).toBe(FC);
			const c = qc1NcsBI2014({ qc: qt, sigmaVeff: d.sigmaVeff[i], FC });
			expect(d.qc1Ncs[i]).toBe(c.qc1Ncs);
			expect(d.CN[i]).toBe(c.CN);
			expect(d.qc1N[i]).toBe(c.qc1N);
			expect(d.CRR[i]).toBe(crrBI2014(c.qc1Ncs));
			expect(d.Dr[i]).toBe(relativeDensityIB2008(c.qc1Ncs));
			// su with the unit's Nkt (12 for A, default 14 for B), Lunne et al. (1997).
			expectAbsClose(d.su[i], (qt - d.sigmaV[i]) / (unit.Nkt ?? 14), 1e-9, `su[${i}]`);
			expectRelClose(d.suRatio[i], d.su[i] / d.sigmaVeff[i], 1e-15, `su/σ'v[${i}]`);
		}
	});

	it('derive(sounding, options) puts a clean sand (qc 10 MPa at 5 m) below Ic 2.05 and a soft clay (0.5 MPa) above 2.6', () => {
		// Facts of the trade (common practice): clean sands plot at Ic < 2.05, clay-like soils at Ic > 2.6.
		const units = [{ topElevation: 0, gammaAbove: 18, gammaBelow: 19 }];
		const sand = derive({ depth: col([5]), qc: col([10000]), fs: col([50]), u2: col([40]), groundElevation: 0 }, { units, groundwaterElevation: -1 });
		expect(sand.Ic[0]).toBeLessThan(2.05);
		expect(sand.FC[0]).toBeLessThan(35);
		const clay = derive(
			{ depth: col([5]), qc: col([500]), fs: col([10]), u2: col([200]), groundElevation: 0 },
			{ units: [{ topElevation: 0, gammaAbove: 16, gammaBelow: 16 }], groundwaterElevation: -1 }
		);
		expect(clay.Ic[0]).toBeGreaterThan(2.6);
		expect(clay.flags[0]).toBe(0);
	});

	it('derive(sounding, options) flags out-of-range results without clamping them', () => {
		const s = {
			depth: col([0, 2, 3, 8]),
			qc: col([1000, 20, 40000, 3000]),
			fs: col([10, 5, 100, 30]),
			groundElevation: 0
		};
		const d = derive(s, { units: [{ topElevation: 0, gammaAbove: 18, gammaBelow: 20 }], groundwaterElevation: -1 });
		// Depth 0: σ'v = 0.
		expect(d.flags[0] & CptFlag.nonPositiveStress).toBeTruthy();
		// qc = 20 kPa at 2 m (σv = 38): negative net resistance, su kept negative.
		expect(d.flags[1] & CptFlag.negativeNetResistance).toBeTruthy();
		expect(d.su[1]).toBeLessThan(0);
		// A very dense reading: Dr above 1, kept as computed.
		expect(d.flags[2] & CptFlag.drOutOfRange).toBeTruthy();
		expect(d.Dr[2]).toBeGreaterThan(1);
		expect(d.flags[2] & CptFlag.qc1NcsOutOfRange).toBeTruthy();
		// No u2 column: qt = qc, flagged.
		for (let i = 0; i < 4; i++) expect(d.flags[i] & CptFlag.qtFromQc).toBeTruthy();
		expect(d.qt[3]).toBe(3000);
		expect(describeFlags(d.flags[1])).toContain('negativeNetResistance');
	});

	it('derive(sounding, options) uses a valid measured FC and flags an invalid one', () => {
		const s = { depth: col([2, 3, 4]), qc: col([5000, 5000, 5000]), fs: col([50, 50, 50]), groundElevation: 0 };
		const d = derive(s, { units: twoUnits, groundwaterElevation: -1, fc: [12, NaN, 140] });
		expect(d.FC[0]).toBe(12);
		expect(d.flags[0] & CptFlag.measuredFinesContent).toBeTruthy();
		expect(d.FC[1]).toBe(finesContentFromIc(d.Ic[1], twoUnits[d.unit[1]].CFC ?? 0));
		expect(d.flags[2] & CptFlag.measuredFinesContentInvalid).toBeTruthy();
		expect(d.FC[2]).toBe(finesContentFromIc(d.Ic[2], twoUnits[d.unit[2]].CFC ?? 0));
	});

	it('derive(sounding, options) flags missing readings as NaN and keeps going', () => {
		const s = { depth: col([2, 3, 4]), qc: col([5000, NaN, 5000]), fs: col([50, 50, NaN]), groundElevation: 0 };
		const d = derive(s, { units: twoUnits, groundwaterElevation: -1 });
		expect(d.Ic[1]).toBeNaN();
		expect(d.Ic[2]).toBeNaN();
		expect(d.flags[1] & CptFlag.missingReading).toBeTruthy();
		expect(d.flags[2] & CptFlag.missingReading).toBeTruthy();
		expect(Number.isFinite(d.Ic[0])).toBe(true);
		expect(Number.isFinite(d.sigmaV[2])).toBe(true);
	});

	it('derive(sounding, options) skips absent units, takes the lower unit at a contact and flags readings above the first unit', () => {
		const units: UnitAtSounding[] = [
			{ topElevation: 0, gammaAbove: 17, gammaBelow: 17 },
			{ topElevation: NaN, gammaAbove: 99, gammaBelow: 99 },
			{ topElevation: -2, gammaAbove: 19, gammaBelow: 19 },
			{ topElevation: -2, gammaAbove: 21, gammaBelow: 21 }
		];
		const s = { depth: col([0.5, 1, 2, 3]), qc: col([2000, 2000, 2000, 2000]), fs: col([20, 20, 20, 20]), groundElevation: 0 };
		const d = derive(s, { units, groundwaterElevation: -10 });
		expect(Array.from(d.unit)).toEqual([0, 0, 3, 3]);
		expect(d.flags[0] & CptFlag.aboveFirstUnit).toBe(0);
		// Ground at 0.6 is above the first top (0): the first unit extends up, flagged for readings above 0.
		const high = derive({ ...s, depth: col([0.3, 1]), qc: col([1, 1]), fs: col([1, 1]), groundElevation: 0.6 }, { units, groundwaterElevation: -10 });
		expect(high.flags[0] & CptFlag.aboveFirstUnit).toBeTruthy();
		expect(high.unit[0]).toBe(0);
		expect(high.flags[1] & CptFlag.aboveFirstUnit).toBe(0);
		// The zero-thickness unit 2 adds nothing: σv at 3 m = 17·2 + 21·1.
		expectAbsClose(d.sigmaV[3], 17 * 2 + 21 * 1, 1e-9);
	});

	it('derive(sounding, options) does not mutate its inputs and accepts plain arrays', () => {
		const s = { depth: [1, 2], qc: [3000, 4000], fs: [30, 40], u2: [10, 20], groundElevation: 0 };
		const copy = JSON.parse(JSON.stringify(s));
		const units = [{ topElevation: 0, gammaAbove: 18, gammaBelow: 19 }];
		const d = derive(s, { units, groundwaterElevation: -0.5 });
		expect(s).toEqual(copy);
		expect(units).toEqual([{ topElevation: 0, gammaAbove: 18, gammaBelow: 19 }]);
		expect(d.qt).toBeInstanceOf(Float64Array);
	});

	it('derive(sounding, options) returns empty arrays for an empty sounding', () => {
		const d = derive({ depth: [], qc: [], fs: [], groundElevation: 0 }, { units: twoUnits, groundwaterElevation: 0 });
		expect(d.Ic.length).toBe(0);
		expect(d.flags.length).toBe(0);
	});

	it('derive(sounding, options) throws RangeError for bad input', () => {
		const s = { depth: [1, 2], qc: [1, 2], fs: [1, 2], groundElevation: 0 };
		const o = { units: twoUnits, groundwaterElevation: -1 };
		expect(() => derive({ ...s, qc: [1] }, o)).toThrow('columns must have equal lengths');
		expect(() => derive({ ...s, depth: [2, 2] }, o)).toThrow('depth must be finite, non-negative and strictly increasing');
		expect(() => derive({ ...s, depth: [-1, 2] }, o)).toThrow(RangeError);
		expect(() => derive({ ...s, depth: [1, NaN] }, o)).toThrow(RangeError);
		expect(() => derive({ depth: [1], qc: [1], fs: [1] }, o)).toThrow('ground elevation is required');
		expect(() => derive(s, { ...o, groundwaterElevation: NaN })).toThrow(RangeError);
		expect(() => derive(s, { ...o, units: [] })).toThrow('at least one unit is required');
		expect(() => derive(s, { ...o, units: [twoUnits[1], twoUnits[0]] })).toThrow('units must be ordered top down');
		expect(() => derive(s, { ...o, units: [{ topElevation: 0, gammaAbove: 0, gammaBelow: 18 }] })).toThrow('unit weights must be positive');
		expect(() => derive(s, { ...o, units: [{ topElevation: 0, gammaAbove: 18, gammaBelow: 18, Nkt: 0 }] })).toThrow('Nkt must be positive');
		expect(() => derive(s, { ...o, units: [{ topElevation: NaN, gammaAbove: 18, gammaBelow: 18 }] })).toThrow('at least one unit must be present');
		expect(() => derive(s, { ...o, areaRatio: 2 })).toThrow('area ratio must be within 0–1');
		expect(() => derive(s, { ...o, fc: [1] })).toThrow('columns must have equal lengths');
	});

	it('derive(sounding, options) handles a long sounding quickly', () => {
		const N = 5000;
		const depth = Array.from({ length: N }, (_, i) => 0.02 * (i + 1));
		const s = { depth, qc: depth.map((z) => 2000 + 500 * z), fs: depth.map(() => 30), u2: depth.map((z) => 10 * z), groundElevation: 5 };
		const t0 = performance.now();
		const d = derive(s, { units: twoUnits.map((u) => ({ ...u, topElevation: u.topElevation + 5 })), groundwaterElevation: 3 });
		expect(performance.now() - t0).toBeLessThan(1000);
		expect(d.Ic.length).toBe(N);
	});
});
