import { describe, expect, it } from 'vitest';
import { ElementIds } from '../../../src/lib/server/exports/element-ids';

describe('ElementIds(text)', () => {
	it('reads each id by position, as splitting the stored text at line breaks would', () => {
		const ids = ['E1', 'beam, "left"', '', 'σ′v-7', 'last'];
		const e = new ElementIds(ids.join('\n'));
		expect(e.length).toBe(5);
		expect(Array.from({ length: e.length }, (_, i) => e.at(i))).toEqual(ids);
	});

	it('one id, and a million, match split()', () => {
		expect(new ElementIds('only').at(0)).toBe('only');
		expect(new ElementIds('only').length).toBe(1);
		const text = Array.from({ length: 1_000_000 }, (_, i) => `M${i * 7}`).join('\n');
		const split = text.split('\n');
		const e = new ElementIds(text);
		expect(e.length).toBe(split.length);
		for (const i of [0, 1, 499_999, 999_998, 999_999]) expect(e.at(i)).toBe(split[i]);
	});
});
