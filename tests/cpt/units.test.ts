import { describe, expect, it } from 'vitest';
import { TSF_TO_KPA, lengthUnitFactor, stressUnitFactor } from '$lib/cpt';

describe('stressUnitFactor(unit) and lengthUnitFactor(unit)', () => {
	it('stressUnitFactor(unit) knows exact factors to kPa, case- and spelling-insensitive', () => {
		expect(stressUnitFactor('MPa')).toBe(1000);
		expect(stressUnitFactor('MN/m2')).toBe(1000);
		expect(stressUnitFactor('MN/m²')).toBe(1000);
		expect(stressUnitFactor('kN/m^2')).toBe(1);
		expect(stressUnitFactor(' kpa ')).toBe(1);
		expect(stressUnitFactor('Pa')).toBe(0.001);
		expect(stressUnitFactor('bar')).toBe(100);
		expect(stressUnitFactor('tsf')).toBe(TSF_TO_KPA);
		expect(stressUnitFactor('psi')).toBeUndefined();
		expect(stressUnitFactor('')).toBeUndefined();
	});
	it('lengthUnitFactor(unit) knows m, cm, mm and ft', () => {
		expect(lengthUnitFactor('m')).toBe(1);
		expect(lengthUnitFactor('cm')).toBe(0.01);
		expect(lengthUnitFactor('MM')).toBe(0.001);
		expect(lengthUnitFactor('ft')).toBe(0.3048);
		expect(lengthUnitFactor('yd')).toBeUndefined();
	});
});
