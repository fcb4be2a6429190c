// σ′v at a model's element, read from the stratigraphy, unit weights and groundwater between two soundings, against
// values worked by hand (unit weights above and below the water table, Terzaghi's effective stress).
import { describe, expect, it } from 'vitest';
import { gridStratigraphy, stressReader } from '../../src/lib/site/index';
import { expectAbsClose } from '../asserts';

// S1 at ch 0: ground 4, clay from the ground, sand top 0; water at +2.
// S2 at ch 20: ground 6, clay from the ground, sand top −2; water at +4.
// At ch 10 (half way): ground 5, sand top −1, water +3.
const strat = gridStratigraphy({
	sectionLine: null,
	soundings: [
		{ id: 's1', name: 'S1', chainage: 0, x: null, y: null, groundElevation: 4 },
		{ id: 's2', name: 'S2', chainage: 20, x: null, y: null, groundElevation: 6 }
	],
	units: [
		{ id: 'clay', name: 'Clay' },
		{ id: 'sand', name: 'Sand' }
	],
	contacts: [
		{ soundingId: 's1', unitId: 'sand', topElevation: 0 },
		{ soundingId: 's2', unitId: 'sand', topElevation: -2 }
	],
	boundaries: []
});
const weights = [
	{ gammaAbove: 16, gammaBelow: 17 },
	{ gammaAbove: 18, gammaBelow: 20 }
];
const water = [
	{ chainage: 0, x: null, y: null, groundwater: 2 },
	{ chainage: 20, x: null, y: null, groundwater: 4 }
];

describe('stressReader(stratigraphy, weights, groundwater, geometry)', () => {
	const at = stressReader(strat, weights, water, '2d');

	it('at ch 10, el −3: σv = 16·2 + 17·4 + 20·2 = 140 kPa, u0 = 9.81·6 = 58.86 kPa, σ′v = 81.14 kPa (by hand)', () => {
		const s = at(10, 0, -3)!;
		expectAbsClose(s.sigmaV, 140, 1e-9);
		expectAbsClose(s.u0, 58.86, 1e-9);
		expectAbsClose(s.sigmaVeff, 81.14, 1e-9);
	});

	it('above the water table at ch 10, el +4: σv = σ′v = 16 kPa', () => {
		const s = at(10, 0, 4)!;
		expectAbsClose(s.sigmaV, 16, 1e-12);
		expect(s.u0).toBe(0);
	});

	it('at a sounding it agrees with that sounding’s own column: ch 0, el −1 → 16·2 + 17·2 + 20·1 = 86, u0 = 29.43', () => {
		const s = at(0, 0, -1)!;
		expectAbsClose(s.sigmaV, 86, 1e-9);
		expectAbsClose(s.sigmaVeff, 86 - 29.43, 1e-9);
	});

	it('without any groundwater elevation the water stands at the ground (the cautious default of the derivation)', () => {
		const dry = stressReader(strat, weights, [], '2d');
		const s = dry(10, 0, 3)!;
		// Ground 5: 2 m of clay below water → σv = 34, u0 = 19.62.
		expectAbsClose(s.sigmaV, 34, 1e-12);
		expectAbsClose(s.u0, 19.62, 1e-12);
	});

	it('answers null where no sounding is located', () => {
		const none = stressReader(gridStratigraphy({ sectionLine: null, soundings: [], units: [{ id: 'a', name: 'A' }], contacts: [], boundaries: [] }), weights, water, '2d');
		expect(none(0, 0, 0)).toBeNull();
	});
});
