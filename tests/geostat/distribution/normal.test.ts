import { describe, it, expect } from 'vitest';
import { inverseNormalCdf, normalCdf } from '../../../src/lib/geostat/index';
import { expectAbsClose, expectRelClose } from '../../asserts';

// Standard normal quantiles, Abramowitz & Stegun (1964), ch. 26, table 26.5 / any statistics handbook;
// the three marked REFERENCES are listed in REFERENCES.md, the others are from memory, each cross-checked
// against a 40-digit evaluation of √2·erfinv(2p − 1) before being written here.
const QUANTILES: [number, number][] = [
	[0.975, 1.959963984540054], // REFERENCES
	[0.999, 3.090232306167813], // REFERENCES
	[0.9, 1.2815515655446004], // REFERENCES
	[0.95, 1.6448536269514722], // (from memory)
	[0.99, 2.3263478740408408], // (from memory)
	[0.995, 2.5758293035489004], // (from memory)
	[0.5, 0]
];

describe('inverseNormalCdf(p)', () => {
	it('inverseNormalCdf(p) matches tabulated quantiles to 1e-15 relative (A&S 1964 ch. 26)', () => {
		for (const [p, x] of QUANTILES) {
			expectAbsClose(inverseNormalCdf(p), x, 1e-15 * Math.abs(x), `p=${p}`);
			expectAbsClose(inverseNormalCdf(1 - p), -x, 1e-15 * Math.abs(x) + 1e-15, `p=${1 - p}`);
		}
	});

	it('inverseNormalCdf(p) matches deep-tail quantiles to 1e-14 relative (40-digit reference, from memory)', () => {
		// Φ⁻¹(1e-10) = −6.361340902404056, Φ⁻¹(1e-20) = −9.262340089798408, Φ⁻¹(1e-300) = −37.0470962993612.
		expectRelClose(inverseNormalCdf(1e-10), -6.361340902404056, 1e-14);
		expectRelClose(inverseNormalCdf(1e-20), -9.262340089798408, 1e-14);
		expectRelClose(inverseNormalCdf(1e-300), -37.0470962993612, 1e-14);
	});

	it('inverseNormalCdf(normalCdf(x)) round-trips to 1e-12 relative for −37 < x ≤ 0, and to p-resolution above', () => {
		for (let x = -37; x <= 8; x += 0.137) {
			const y = inverseNormalCdf(normalCdf(x));
			// For x > 0, p = Φ(x) is stored near 1 with spacing 2^-53, which moves Φ⁻¹ by up to 2^-53/φ(x).
			const density = Math.exp(-0.5 * x * x) / Math.sqrt(2 * Math.PI);
			const tol = 1e-12 * Math.max(1, Math.abs(x)) + (x > 0 ? 2 ** -53 / density : 0);
			expectAbsClose(y, x, tol, `x=${x}`);
		}
	});

	it('normalCdf(inverseNormalCdf(p)) round-trips to 1e-15·(1 + x²) relative for 1e-300 < p < 1 − 1e-16', () => {
		for (let e = -300; e <= -1; e += 7) {
			const p = 10 ** e;
			const x = inverseNormalCdf(p);
			// Conditioning: d ln Φ / dx ≈ |x| in the tail, so a relative error ε in x gives about ε·x² in Φ;
			// 1e-15 allows a few ulps from AS 241 and from erfc together.
			expectRelClose(normalCdf(x), p, 1e-15 * (1 + x * x), `p=1e${e}`);
			// Upper half through 1 − p, compared in the complement where the information is.
			const q = 1 - p;
			if (q < 1) expectAbsClose(1 - normalCdf(inverseNormalCdf(q)), 1 - q, 1e-13 * (1 - q) + 2e-16, `p=1-1e${e}`);
		}
		for (let p = 0.01; p < 1; p += 0.01) expectRelClose(normalCdf(inverseNormalCdf(p)), p, 1e-14, `p=${p}`);
	});

	it('inverseNormalCdf(p) is odd about p = 0.5 and strictly increasing', () => {
		let prev = -Infinity;
		for (let i = 1; i < 2000; i++) {
			const p = i / 2000;
			const x = inverseNormalCdf(p);
			expect(x).toBeGreaterThan(prev);
			prev = x;
			expectAbsClose(x + inverseNormalCdf(1 - p), 0, 1e-14 * Math.max(1, Math.abs(x)), `p=${p}`);
		}
	});

	it('inverseNormalCdf(p) handles 0, 1, NaN and rejects p outside [0, 1]', () => {
		expect(inverseNormalCdf(0)).toBe(-Infinity);
		expect(inverseNormalCdf(1)).toBe(Infinity);
		expect(inverseNormalCdf(NaN)).toBeNaN();
		expect(() => inverseNormalCdf(-0.1)).toThrow(RangeError);
		expect(() => inverseNormalCdf(1.5)).toThrow('p must be in [0, 1]');
		expect(() => inverseNormalCdf('0.5' as unknown as number)).toThrow(TypeError);
	});
});

describe('normalCdf(x)', () => {
	it('normalCdf(x) matches tabulated values to 1e-15 absolute (A&S 1964 table 26.1, from memory)', () => {
		expectAbsClose(normalCdf(0), 0.5, 0);
		expectAbsClose(normalCdf(1), 0.8413447460685429, 1e-15);
		expectAbsClose(normalCdf(2), 0.9772498680518208, 1e-15);
		expectAbsClose(normalCdf(3), 0.9986501019683699, 1e-15);
		expectAbsClose(normalCdf(-1), 0.15865525393145705, 1e-15);
		expectAbsClose(normalCdf(1.959963984540054), 0.975, 1e-15);
	});

	it('normalCdf(x) keeps relative accuracy 1e-13 in the lower tail (Φ(−10) = 7.61985302416053e-24, from memory)', () => {
		expectRelClose(normalCdf(-10), 7.61985302416053e-24, 1e-13);
		expectRelClose(normalCdf(-5), 2.866515718791939e-7, 1e-13);
	});

	it('normalCdf(x) satisfies Φ(x) + Φ(−x) = 1 to 1e-15 absolute', () => {
		for (let x = -8; x <= 8; x += 0.25) expectAbsClose(normalCdf(x) + normalCdf(-x), 1, 1e-15, `x=${x}`);
	});

	it('normalCdf(x) is 0 and 1 at the infinities and NaN at NaN', () => {
		expect(normalCdf(-Infinity)).toBe(0);
		expect(normalCdf(Infinity)).toBe(1);
		expect(normalCdf(NaN)).toBeNaN();
		expect(() => normalCdf(null as unknown as number)).toThrow(TypeError);
	});
});
