import { describe, expect, it } from 'vitest';
import { lookUp, lookupTableProblem, type LookupTable } from '$lib/cpt';

// A made-up table of our own: a modulus coefficient against relative density.
const table: LookupTable = { points: [[0.2, 400], [0.5, 700], [0.8, 1300]], monotonic: 'increasing' };

describe('lookUp(table, x)', () => {
	it('lookUp is exact at the points and linear between them', () => {
		expect(lookUp(table, 0.2)).toEqual({ value: 400, held: 0 });
		expect(lookUp(table, 0.5)).toEqual({ value: 700, held: 0 });
		expect(lookUp(table, 0.8)).toEqual({ value: 1300, held: 0 });
		expect(lookUp(table, 0.35).value).toBeCloseTo(550, 12);
		expect(lookUp(table, 0.65).value).toBeCloseTo(1000, 12);
	});
	it('lookUp holds the end values beyond the table and says which end', () => {
		expect(lookUp(table, 0.1)).toEqual({ value: 400, held: -1 });
		expect(lookUp(table, 1.5)).toEqual({ value: 1300, held: 1 });
		expect(lookUp(table, NaN)).toEqual({ value: NaN, held: 0 });
	});
});

describe('lookupTableProblem(table)', () => {
	it('accepts a good table and says what is wrong with a bad one', () => {
		expect(lookupTableProblem(table)).toBeNull();
		expect(lookupTableProblem({ points: [[1, 2]], monotonic: 'none' })).toBe('A table needs at least two points.');
		expect(lookupTableProblem({ points: [[1, 2], [1, 3]], monotonic: 'none' })).toMatch(/inputs must increase: point 2/);
		expect(lookupTableProblem({ points: [[1, 2], [2, NaN]], monotonic: 'none' })).toMatch(/Point 2 is not/);
		expect(lookupTableProblem({ points: [[1, 5], [2, 4]], monotonic: 'increasing' })).toMatch(/must not fall: point 2/);
		expect(lookupTableProblem({ points: [[1, 5], [2, 6]], monotonic: 'decreasing' })).toMatch(/must not rise: point 2/);
		expect(lookupTableProblem({ points: [[1, 5], [2, 4], [3, 6]], monotonic: 'none' })).toBeNull();
	});
});
