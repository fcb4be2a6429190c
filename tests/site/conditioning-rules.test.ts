import { describe, expect, it } from 'vitest';
import { DEFAULT_RULES, readingRule, RULE_ORDER, type ConditioningRules, type RuleReading } from '../../src/lib/site/index';

const reading: RuleReading = { value: 0.3, depth: 2, elevation: -2, sigmaVeff: 20, flagged: false };
const strict: ConditioningRules = { contactBuffer: 0.25, minDepth: 1, minSigmaVeff: 15, excludedSoundings: [], flagged: 'exclude' };

describe('readingRule(reading, contacts, rules)', () => {
	it('readingRule keeps every reading with a value under the default rules', () => {
		expect(readingRule(reading, [-2], DEFAULT_RULES)).toBeNull();
		expect(readingRule({ ...reading, depth: 0, sigmaVeff: NaN, flagged: true }, [-2], DEFAULT_RULES)).toBeNull();
		expect(readingRule({ ...reading, value: NaN }, [], DEFAULT_RULES)).toBe('noValue');
	});

	it('readingRule names the first rule that leaves a reading out, in RULE_ORDER', () => {
		expect(RULE_ORDER).toEqual(['sounding', 'noValue', 'minDepth', 'minSigmaVeff', 'contactBuffer', 'flagged']);
		const all = { value: NaN, depth: 0.5, elevation: -0.5, sigmaVeff: 5, flagged: true };
		expect(readingRule(all, [-0.5], strict)).toBe('noValue');
		expect(readingRule({ ...all, value: 1 }, [-0.5], strict)).toBe('minDepth');
		expect(readingRule({ ...all, value: 1, depth: 1 }, [-0.5], strict)).toBe('minSigmaVeff');
		expect(readingRule({ ...all, value: 1, depth: 1, sigmaVeff: 15 }, [-0.5], strict)).toBe('contactBuffer');
		expect(readingRule({ ...all, value: 1, depth: 1, sigmaVeff: 15, elevation: -0.75 }, [-0.5], strict)).toBe('flagged');
		expect(readingRule({ ...all, value: 1, depth: 1, sigmaVeff: 15, elevation: -0.75, flagged: false }, [-0.5], strict)).toBeNull();
	});

	it('readingRule: limits are inclusive for depth and σ′v, strict at the buffer edge; an unknown σ′v fails a set limit', () => {
		expect(readingRule({ ...reading, depth: 1 }, [], strict)).toBeNull();
		expect(readingRule({ ...reading, sigmaVeff: 15 }, [], strict)).toBeNull();
		expect(readingRule({ ...reading, sigmaVeff: NaN }, [], strict)).toBe('minSigmaVeff');
		// 0.25 away from the contact is outside a 0.25 buffer (|Δz| < buffer leaves out).
		expect(readingRule({ ...reading, elevation: -2 }, [-1.75], strict)).toBeNull();
		expect(readingRule({ ...reading, elevation: -2 }, [-1.8], strict)).toBe('contactBuffer');
		expect(readingRule({ ...reading, flagged: true }, [], { ...strict, flagged: 'keep' })).toBeNull();
	});
});
