// σv, u0 and σ′v at an elevation of a crafted column, worked by hand (Terzaghi's effective stress; unit weights
// per unit above and below the water table, as the CPT derivation takes them), and agreement with derive().
import { describe, expect, it } from 'vitest';
import { derive, verticalStressAt, type StressColumn } from '$lib/cpt';
import { expectAbsClose } from '../asserts';

// Ground at +5 m; water at +3 m; clay (17 / 18 kN/m³ above / below water) from the ground, sand (19 / 20) from +1 m.
const column: StressColumn = {
	ground: 5,
	groundwater: 3,
	units: [
		{ top: 5, gammaAbove: 17, gammaBelow: 18 },
		{ top: 1, gammaAbove: 19, gammaBelow: 20 }
	]
};

describe('verticalStressAt(column, z)', () => {
	it('verticalStressAt at −2 m: σv = 17·2 + 18·2 + 20·3 = 130 kPa, u0 = 9.81·5 = 49.05 kPa, σ′v = 80.95 kPa (by hand)', () => {
		const s = verticalStressAt(column, -2);
		expectAbsClose(s.sigmaV, 130, 1e-12);
		expectAbsClose(s.u0, 49.05, 1e-12);
		expectAbsClose(s.sigmaVeff, 80.95, 1e-12);
	});

	it('above the water table there is no pore pressure; at and above the ground no stress', () => {
		expect(verticalStressAt(column, 4)).toEqual({ sigmaV: 17, u0: 0, sigmaVeff: 17 });
		expect(verticalStressAt(column, 5)).toEqual({ sigmaV: 0, u0: 0, sigmaVeff: 0 });
		expect(verticalStressAt(column, 6).sigmaV).toBe(0);
	});

	it('ponded water above the ground loads the column: water at +6, z = +4 gives σv = 9.81 + 18, u0 = 19.62', () => {
		const s = verticalStressAt({ ...column, groundwater: 6 }, 4);
		expectAbsClose(s.sigmaV, 9.81 + 18, 1e-12);
		expectAbsClose(s.u0, 19.62, 1e-12);
		expectAbsClose(s.sigmaVeff, 8.19, 1e-12);
	});

	it('agrees with derive() at every reading of a sounding through the same column', () => {
		const depth = Float64Array.from({ length: 90 }, (_, i) => 0.05 + i * 0.1);
		const qc = new Float64Array(90).fill(5000);
		const fs = new Float64Array(90).fill(50);
		const d = derive(
			{ depth, qc, fs, groundElevation: 5 },
			{ units: column.units.map((u) => ({ topElevation: u.top, gammaAbove: u.gammaAbove, gammaBelow: u.gammaBelow })), groundwaterElevation: 3 }
		);
		for (let i = 0; i < 90; i++) {
			const s = verticalStressAt(column, d.elevation[i]);
			expectAbsClose(s.sigmaV, d.sigmaV[i], 1e-9, `σv at ${d.elevation[i]}`);
			expectAbsClose(s.sigmaVeff, d.sigmaVeff[i], 1e-9, `σ′v at ${d.elevation[i]}`);
		}
	});

	it('refuses no units, tops rising downwards, non-positive weights and non-finite input', () => {
		expect(() => verticalStressAt({ ...column, units: [] }, 0)).toThrow('a column needs at least one unit');
		expect(() => verticalStressAt({ ...column, units: [column.units[1], column.units[0]] }, 0)).toThrow('unit tops must not rise downwards');
		expect(() => verticalStressAt({ ...column, units: [{ top: 5, gammaAbove: 0, gammaBelow: 18 }] }, 0)).toThrow('unit weights must be positive');
		expect(() => verticalStressAt(column, NaN)).toThrow(RangeError);
	});
});
