import { describe, it, expect } from 'vitest';
import { cellDeclusterWeights, type Sample } from '../../../src/lib/geostat/index';
import { expectAbsClose } from '../../asserts';

const s = (x: number, y: number, z: number, value = 0): Sample => ({ x, y, z, value });

describe('cellDeclusterWeights(samples, cell) (Deutsch 1989)', () => {
	it('cellDeclusterWeights gives 1 / (count in cell · occupied cells), cells anchored at the minimum coordinates', () => {
		// Cells 10 × 10 × ∞ from (0, 0): three samples in cell (0,0), one in (1,0), one in (0,2); 3 occupied cells.
		const samples = [s(0, 0, 0), s(2, 3, -5), s(9.9, 9.9, 1), s(15, 0, 0), s(0, 25, 0)];
		const w = cellDeclusterWeights(samples, { x: 10, y: 10, z: Infinity });
		const third = 1 / 9;
		expect(Array.from(w)).toEqual([third, third, third, 1 / 3, 1 / 3]);
		let sum = 0;
		for (const x of w) sum += x;
		expectAbsClose(sum, 1, 1e-15);
	});

	it('cellDeclusterWeights anchors at the minimum, not at 0 (a shifted data set gets the same weights)', () => {
		const a = [s(0, 0, 0), s(4, 0, 0), s(6, 0, 0)];
		const b = a.map((p) => s(p.x + 1003, p.y - 57, p.z + 12));
		expect(Array.from(cellDeclusterWeights(b, { x: 5, y: 5, z: 5 }))).toEqual(Array.from(cellDeclusterWeights(a, { x: 5, y: 5, z: 5 })));
		expect(Array.from(cellDeclusterWeights(a, { x: 5, y: 5, z: 5 }))).toEqual([0.25, 0.25, 0.5]);
	});

	it('cellDeclusterWeights is equal for one sample, duplicates, and a cell smaller than any spacing', () => {
		expect(Array.from(cellDeclusterWeights([s(1, 1, 1)], { x: 1, y: 1, z: 1 }))).toEqual([1]);
		expect(Array.from(cellDeclusterWeights([s(1, 1, 1), s(1, 1, 1)], { x: 1, y: 1, z: 1 }))).toEqual([0.5, 0.5]);
		expect(Array.from(cellDeclusterWeights([s(0, 0, 0), s(1, 0, 0), s(2, 0, 0)], { x: 0.5, y: 0.5, z: 0.5 }))).toEqual([1 / 3, 1 / 3, 1 / 3]);
	});

	it('cellDeclusterWeights rejects bad input with short messages', () => {
		expect(() => cellDeclusterWeights([], { x: 1, y: 1, z: 1 })).toThrow('no samples');
		expect(() => cellDeclusterWeights([s(0, 0, 0)], { x: 0, y: 1, z: 1 })).toThrow('cell sizes must be > 0');
		expect(() => cellDeclusterWeights([s(NaN, 0, 0)], { x: 1, y: 1, z: 1 })).toThrow('coordinates must be finite');
		expect(() => cellDeclusterWeights([s(0, 0, 0)], null as unknown as { x: number; y: number; z: number })).toThrow(TypeError);
		expect(() => cellDeclusterWeights('a' as unknown as Sample[], { x: 1, y: 1, z: 1 })).toThrow(TypeError);
	});
});
