import { describe, expect, it } from 'vitest';
import {
	PROPERTIES,
	PROPERTY_INFO,
	PROPERTY_KEYS,
	SECTION_OPTIONS,
	SIMULATED_OPTIONS,
	SIMULATED_PROPERTIES,
	isSimulatedProperty,
	labelWithUnit,
	correlationFlagMask,
	correlationFlagText
} from '../src/lib/properties';
import { CptFlag } from '../src/lib/cpt/flags';
import { domains, units } from '../src/lib/server/db/site-schema';
import { domainCreateSchema, sectionProperty, simulatedProperty, unitCreateSchema } from '../src/lib/schemas/stratigraphy';
import { derive } from '../src/lib/cpt/index';

const simulated = PROPERTIES.filter((p) => p.simulatable).map((p) => p.key);

describe('the property catalogue', () => {
	it('PROPERTIES names each key once, with a label, a unit, whole decimals and an ordered range with its source', () => {
		expect(new Set(PROPERTIES.map((p) => p.key)).size).toBe(PROPERTIES.length);
		for (const p of PROPERTIES) {
			expect(p.label, p.key).not.toBe('');
			expect(p.unit, p.key).not.toBe('');
			expect(Number.isInteger(p.decimals) && p.decimals >= 0 && p.decimals <= 4, p.key).toBe(true);
			expect(p.description.length, p.key).toBeGreaterThan(10);
			expect(p.range.min, p.key).toBeLessThan(p.range.max);
			expect(p.range.source.length, p.key).toBeGreaterThan(10);
			expect(PROPERTY_INFO[p.key]).toBe(p);
		}
	});

	it('the database enum of units and domains is the simulated keys, in catalogue order', () => {
		expect(SIMULATED_PROPERTIES).toEqual(simulated);
		expect(units.property.enumValues).toEqual(simulated);
		expect(domains.property.enumValues).toEqual(simulated);
	});

	it('the zod enums are the simulated keys (units, domains) and every key (section traces)', () => {
		expect(simulatedProperty.options).toEqual(simulated);
		expect(sectionProperty.options).toEqual(PROPERTY_KEYS);
		expect(PROPERTY_KEYS).toEqual(PROPERTIES.map((p) => p.key));
		expect(unitCreateSchema.safeParse({ name: 'Clay', property: 'Qtn' }).success).toBe(true);
		expect(unitCreateSchema.safeParse({ name: 'Clay', property: 'qc' }).success).toBe(false);
		expect(domainCreateSchema.safeParse({ name: 'Sand', property: 'CRR' }).success).toBe(false);
		expect(sectionProperty.safeParse('CRR').success).toBe(true);
		expect(sectionProperty.safeParse('sigmaV').success).toBe(false);
	});

	it('the select lists offer the same keys: the section picker every property (Qtn too), units and domains the simulated ones', () => {
		expect(SECTION_OPTIONS.map((o) => o.key)).toEqual(PROPERTY_KEYS);
		expect(SECTION_OPTIONS.map((o) => o.key)).toContain('Qtn');
		expect(SIMULATED_OPTIONS.map((o) => o.key)).toEqual(simulated);
		expect(SIMULATED_OPTIONS.find((o) => o.key === 'qc1Ncs')!.text).toBe('qc1Ncs (sands)');
		expect(SIMULATED_OPTIONS.find((o) => o.key === 'su')!.text).toBe('su (kPa)');
		expect(SECTION_OPTIONS.find((o) => o.key === 'suRatio')!.text).toBe('su/σ′v');
		expect(SECTION_OPTIONS.find((o) => o.key === 'qt')!.text).toBe('qt (kPa)');
		expect(SECTION_OPTIONS.find((o) => o.key === 'Ic')!.text).toBe('Ic');
	});

	it('isSimulatedProperty(key) and labelWithUnit(p) follow the catalogue', () => {
		expect(PROPERTY_KEYS.filter(isSimulatedProperty)).toEqual(simulated);
		expect(isSimulatedProperty('qc')).toBe(false);
		expect(labelWithUnit(PROPERTY_INFO.FC)).toBe('FC (%)');
		expect(labelWithUnit(PROPERTY_INFO.suRatio)).toBe('su/σ′v');
	});

	it('every key is a column the CPT pipeline derives, or a measured one (qc, fs, u2)', () => {
		const depth = Float64Array.from([1, 2, 3]);
		const out = derive(
			{ depth, qc: Float64Array.from([3000, 5000, 8000]), fs: Float64Array.from([30, 40, 60]), u2: Float64Array.from([10, 20, 30]), groundElevation: 5 },
			{ units: [{ topElevation: 5, gammaAbove: 18, gammaBelow: 19 }], groundwaterElevation: 4 }
		);
		for (const key of PROPERTY_KEYS) {
			const measured = key === 'qc' || key === 'fs' || key === 'u2';
			expect(measured || (key in out && (out as unknown as Record<string, unknown>)[key] instanceof Float64Array), key).toBe(true);
		}
	});
});

describe('correlation flags of the catalogue', () => {
	it('correlationFlagMask(key) ORs the property\'s flags; correlationFlagText words them; qt has none', () => {
		expect(correlationFlagMask('qc1Ncs')).toBe(CptFlag.qc1NcsOutOfRange | CptFlag.icOutOfChart | CptFlag.notConverged);
		expect(correlationFlagText('qc1Ncs')).toBe('qc1Ncs outside 21–254, Ic off the chart, an iteration that did not converge');
		expect(correlationFlagMask('qt')).toBe(0);
		expect(correlationFlagText('qt')).toBe('');
		// Every simulated property names its flags, each a real CptFlag with plain words.
		for (const key of SIMULATED_PROPERTIES) {
			const flags = PROPERTY_INFO[key].flags;
			expect(Array.isArray(flags), key).toBe(true);
			for (const f of flags!) expect(CptFlag[f], `${key} ${f}`).toBeGreaterThan(0);
			expect(correlationFlagText(key)).not.toMatch(/[a-z][A-Z]/);
		}
	});
});
