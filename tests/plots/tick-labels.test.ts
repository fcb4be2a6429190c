import { describe, expect, it } from 'vitest';
import { fitTickLabels } from '../../src/lib/plots/tick-labels';

const at = (values: number[], x0: number, width: number, max: number) => values.map((v) => ({ x: x0 + (v / max) * width, text: String(v) }));

describe('fitTickLabels(ticks, span)', () => {
	it('fitTickLabels anchors the end labels inside the span, so adjacent tracks do not run together', () => {
		// Two 84 px tracks 18 px apart: "0 50 100" then "0 200 400". Centred, "100" would reach past its track.
		const a = fitTickLabels(at([0, 50, 100], 50, 84, 100), [50, 134]);
		const b = fitTickLabels(at([0, 200, 400], 152, 84, 400), [152, 236]);
		expect(a.map((l) => l.anchor)).toEqual(['start', 'middle', 'end']);
		expect(b.map((l) => l.anchor)).toEqual(['start', 'middle', 'end']);
		// The last label of the first track ends at its right edge, before the next track's first label starts.
		expect(a[2].x).toBe(134);
		expect(b[0].x).toBe(152);
	});

	it('fitTickLabels drops labels that would overlap, keeping the first and the last', () => {
		const l = fitTickLabels(at([0, 1000, 2000, 3000, 4000, 5000], 0, 60, 5000), [0, 60]);
		expect(l[0].text).toBe('0');
		expect(l[l.length - 1].text).toBe('5000');
		for (let i = 1; i < l.length; i++) expect(l[i].x).toBeGreaterThan(l[i - 1].x);
		expect(l.length).toBeLessThan(6);
	});

	it('fitTickLabels keeps every label where they fit and returns nothing for no ticks', () => {
		expect(fitTickLabels(at([0, 5, 10], 0, 300, 10), [0, 300]).map((l) => l.text)).toEqual(['0', '5', '10']);
		expect(fitTickLabels([], [0, 10])).toEqual([]);
	});
});
