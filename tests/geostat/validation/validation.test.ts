import { describe, it, expect } from 'vitest';
import { dataReproduction, histogramReproduction, variogramReproduction } from '../../../src/lib/geostat/index';
import type { TargetPoints, VariogramModel } from '../../../src/lib/geostat/index';
import { expectAbsClose } from '../../asserts';

function line(n: number): TargetPoints {
	return { x: Float64Array.from({ length: n }, (_, i) => i), y: new Float64Array(n), z: new Float64Array(n), domain: new Int32Array(n) };
}

describe('dataReproduction(realization, targets, samples)', () => {
	it('dataReproduction is the largest |realization − datum| at targets on data, 0 when honoured exactly', () => {
		const t = line(5);
		const real = new Float64Array([0, 1, 2, 3, 4]);
		expect(dataReproduction(real, t, [{ x: 1, y: 0, z: 0, value: 1 }, { x: 3, y: 0, z: 0, value: 3 }])).toEqual({ maxError: 0, count: 2 });
		expect(dataReproduction(real, t, [{ x: 1, y: 0, z: 0, value: 1.5 }, { x: 2.5, y: 0, z: 0, value: 9 }])).toEqual({ maxError: 0.5, count: 1 });
	});
	it('dataReproduction with no samples, NaN at a datum, domain −1, and a length mismatch', () => {
		const t = line(3);
		expect(dataReproduction(new Float64Array(3), t, [])).toEqual({ maxError: 0, count: 0 });
		expect(dataReproduction(new Float64Array([0, NaN, 0]), t, [{ x: 1, y: 0, z: 0, value: 1 }]).maxError).toBeNaN();
		t.domain[1] = -1;
		expect(dataReproduction(new Float64Array(3), t, [{ x: 1, y: 0, z: 0, value: 1 }]).count).toBe(0);
		expect(() => dataReproduction(new Float64Array(2), t, [])).toThrow(RangeError);
	});
});

describe('histogramReproduction(realization, data, weights)', () => {
	it('histogramReproduction of the data themselves has error 0; a shift by 2 has error 2 (within 1e-12)', () => {
		const data = [3, 1, 4, 1, 5, 9, 2, 6];
		expect(histogramReproduction(data, data).maxError).toBe(0);
		expectAbsClose(histogramReproduction(data.map((v) => v + 2), data).maxError, 2, 1e-12);
	});
	it('histogramReproduction uses declustering weights for the reference and skips NaN', () => {
		// Weight 3 on value 10 of [0, 10]: plotting positions 1/8 and 5/8, so the median is 0 + 10·(0.5 − 0.125)/0.5 = 7.5.
		const r = histogramReproduction([NaN, 7.5], [0, 10], [1, 3], [0.5]);
		expectAbsClose(r.reference[0], 7.5, 1e-12);
		expect(r.maxError).toBe(0);
		expect(() => histogramReproduction([NaN], [1])).toThrow(RangeError);
	});
});

describe('variogramReproduction(realization, targets, model, opts)', () => {
	it('variogramReproduction of the linear field v = x has γ(h) = h²/2 exactly, beside the model at h', () => {
		const t = line(30);
		const model: VariogramModel = { azimuth: 90, structures: [{ type: 'exponential', sill: 1, rangeMajor: 10, rangeMinor: 10, rangeVertical: 10 }] };
		const lags = variogramReproduction(Float64Array.from(t.x), t, model, { direction: 'horizontal', lag: 1, nLags: 4, azimuth: 90 });
		for (const b of lags.filter((l) => l.pairs > 0)) {
			expectAbsClose(b.gamma, (b.h * b.h) / 2, 1e-12, `γ(${b.h})`);
			// Exponential practical-range form, REFERENCES.md.
			expectAbsClose(b.model, 1 - Math.exp((-3 * b.h) / 10), 1e-12, `model(${b.h})`);
		}
		expect(() => variogramReproduction(new Float64Array(2), t, model, { direction: 'vertical', lag: 1, nLags: 2 })).toThrow(RangeError);
	});
});
