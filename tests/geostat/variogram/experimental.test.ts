import { describe, it, expect } from 'vitest';
import seedrandom from 'seedrandom';
import { experimentalVariogram, type ExperimentalOptions, type LagBin, type Sample } from '../../../src/lib/geostat/index';
import { expectAbsClose, expectSameBits } from '../../asserts';
import { choleskyFields } from './simulate';

// Matheron's estimator γ(h) = ½·mean((vᵢ − vⱼ)²) (Isaaks & Srivastava 1989, ch. 7); the hand examples below
// are worked from that definition and the binning rule |h − k·lag| ≤ tolerance.

describe("experimentalVariogram(samples, { direction: 'vertical' })", () => {
	const A = (z: number, value: number): Sample => ({ x: 0, y: 0, z, value, sounding: 'A' });
	const samples: Sample[] = [
		A(-2, 2),
		A(0, 1),
		A(-3, 6),
		A(-1, 3),
		{ x: 50, y: 0, z: 0, value: 5, sounding: 'B' },
		{ x: 50, y: 0, z: -1, value: 5, sounding: 'B' },
		// No sounding: cannot pair vertically.
		{ x: 0, y: 0, z: -0.5, value: 100 }
	];

	it("experimentalVariogram(vertical) matches a hand-computed example, pairing within soundings only", () => {
		// h = 1: A (1,3) (3,2) (2,6) → 4 + 1 + 16, B (5,5) → 0: γ = 21 / (2·4) = 2.625.
		// h = 2: (1,2) (3,6) → 1 + 9: γ = 10 / 4 = 2.5.  h = 3: (1,6) → 25: γ = 12.5.  h = 4: empty.
		const bins = experimentalVariogram(samples, { direction: 'vertical', lag: 1, nLags: 4 });
		expect(bins.slice(0, 3)).toEqual([
			{ h: 1, gamma: 2.625, pairs: 4 },
			{ h: 2, gamma: 2.5, pairs: 2 },
			{ h: 3, gamma: 12.5, pairs: 1 }
		]);
		expect(bins[3].pairs).toBe(0);
		expect(bins[3].gamma).toBeNaN();
		expect(bins[3].h).toBe(4);
	});

	it('experimentalVariogram(vertical) counts a pair on a bin boundary in both bins', () => {
		// Lag 2, tolerance 1: h = 1 is in bin 1 only ([1, 3]); h = 3 is on the boundary of bins 1 and 2.
		const bins = experimentalVariogram([A(0, 0), A(-3, 2)], { direction: 'vertical', lag: 2, nLags: 2 });
		expect(bins).toEqual([
			{ h: 3, gamma: 2, pairs: 1 },
			{ h: 3, gamma: 2, pairs: 1 }
		]);
	});

	it('experimentalVariogram(vertical) ignores duplicate locations unless the tolerance reaches h = 0', () => {
		const dup = [A(0, 1), A(0, 3), A(-1, 1)];
		const narrow = experimentalVariogram(dup, { direction: 'vertical', lag: 1, nLags: 1 });
		// Only the two pairs at h = 1: (1,1) → 0 and (3,1) → 4: γ = 1.
		expect(narrow).toEqual([{ h: 1, gamma: 1, pairs: 2 }]);
		const wide = experimentalVariogram(dup, { direction: 'vertical', lag: 1, nLags: 1, lagTolerance: 1 });
		// The h = 0 pair (1,3) → 4 joins: γ = 8 / 6; h = 2/3.
		expectAbsClose(wide[0].gamma, 8 / 6, 1e-15);
		expectAbsClose(wide[0].h, 2 / 3, 1e-15);
		expect(wide[0].pairs).toBe(3);
	});
});

describe("experimentalVariogram(samples, { direction: 'horizontal' })", () => {
	// Soundings P (0, 0), Q (3, 4), R (0, 10): PQ = 5, QR = √45 ≈ 6.708, PR = 10.
	const at = (s: string, z: number, value: number): Sample => {
		const xy = { P: [0, 0], Q: [3, 4], R: [0, 10] }[s]!;
		return { x: xy[0], y: xy[1], z, value, sounding: s };
	};
	const samples = [at('P', 0, 1), at('Q', 0, 4), at('R', 0, 2), at('P', -0.05, 7), at('P', -5, 0), at('Q', -5, 0), at('R', -5, 10)];
	const base: ExperimentalOptions = { direction: 'horizontal', lag: 5, nLags: 2 };

	it('experimentalVariogram(horizontal) matches a hand-computed omnidirectional example', () => {
		// Bin 1 ([2.5, 7.5]): PQ(z0) 9, QR(z0) 4, P'Q 9, PQ(z−5) 0, QR(z−5) 100 → γ = 122/10 = 12.2.
		// Bin 2 ([7.5, 12.5]): PR(z0) 1, P'R 25, PR(z−5) 100 → γ = 126/6 = 21. P–P' share a sounding: no pair.
		const bins = experimentalVariogram(samples, base);
		expect(bins[0].pairs).toBe(5);
		expectAbsClose(bins[0].gamma, 12.2, 1e-14);
		expectAbsClose(bins[0].h, (15 + 2 * Math.sqrt(45)) / 5, 1e-14);
		expect(bins[1]).toEqual({ h: 10, gamma: 21, pairs: 3 });
	});

	it('experimentalVariogram(horizontal) respects verticalBand', () => {
		// Band 0.01 drops the P'–Q and P'–R pairs (|dz| = 0.05).
		const bins = experimentalVariogram(samples, { ...base, verticalBand: 0.01 });
		expect(bins[0].pairs).toBe(4);
		expect(bins[1].pairs).toBe(2);
		expectAbsClose(bins[1].gamma, 101 / 4, 1e-14);
	});

	it('experimentalVariogram(horizontal, azimuth) keeps pairs within the angle tolerance and bandwidth', () => {
		// Azimuth 0 (north): PR lies along it; PQ is 36.87° off, QR 26.57° off.
		const north = experimentalVariogram(samples, { ...base, azimuth: 0 });
		expect(north[0].pairs).toBe(0);
		expect(north[1]).toEqual({ h: 10, gamma: 21, pairs: 3 });
		const wider = experimentalVariogram(samples, { ...base, azimuth: 0, angleTolerance: 30 });
		// QR joins bin 1: (4,2) → 4 and (0,10) → 100: γ = 26.
		expect(wider[0].pairs).toBe(2);
		expectAbsClose(wider[0].gamma, 26, 1e-14);
		// QR is 3 off the north line through Q; a bandwidth of 2 excludes it again.
		const banded = experimentalVariogram(samples, { ...base, azimuth: 0, angleTolerance: 30, bandwidth: 2 });
		expect(banded[0].pairs).toBe(0);
		// Direction is axial: azimuth 180 is the same as 0.
		expect(experimentalVariogram(samples, { ...base, azimuth: 180 })).toEqual(north);
	});

	it('experimentalVariogram(horizontal) treats samples without a sounding as separate soundings', () => {
		const s: Sample[] = [
			{ x: 0, y: 0, z: 0, value: 0 },
			{ x: 5, y: 0, z: 0, value: 2 }
		];
		expect(experimentalVariogram(s, base)[0]).toEqual({ h: 5, gamma: 2, pairs: 1 });
	});
});

describe('experimentalVariogram(samples, { direction: { azimuth, dip } })', () => {
	it('experimentalVariogram(3D) matches a hand-computed example along +x (azimuth 90, dip 0)', () => {
		const s: Sample[] = [
			{ x: 0, y: 0, z: 0, value: 1 },
			{ x: 1, y: 0, z: 0, value: 2 },
			{ x: 2, y: 0, z: 0, value: 4 },
			{ x: 1, y: 0, z: 1, value: 10 }, // 45° off the direction from (0,0,0) and (2,0,0)
			{ x: 0, y: 5, z: 0, value: 3 } // across the direction
		];
		// Bin 1: (1,2) 1, (2,4) 4 → γ = 1.25; bin 2: (1,4) 9 → γ = 4.5.
		const bins = experimentalVariogram(s, { direction: { azimuth: 90, dip: 0 }, lag: 1, nLags: 2 });
		expect(bins.map((b) => b.pairs)).toEqual([2, 1]);
		expectAbsClose(bins[0].gamma, 1.25, 1e-15);
		expectAbsClose(bins[1].gamma, 4.5, 1e-15);
		expectAbsClose(bins[0].h, 1, 1e-15);
	});

	it('experimentalVariogram(3D) with dip 45 pairs along the dipping line only (dip positive downward)', () => {
		const s: Sample[] = [
			{ x: 0, y: 0, z: 0, value: 1 },
			{ x: 1, y: 0, z: 1, value: 10 },
			{ x: 2, y: 0, z: 0, value: 4 }
		];
		// (1,0,1) → (2,0,0) goes +x and down: along azimuth 90, dip 45; (0,0,0) → (1,0,1) goes up: across it.
		const bins = experimentalVariogram(s, { direction: { azimuth: 90, dip: 45 }, lag: 1.4, nLags: 1, lagTolerance: 0.7 });
		expect(bins[0].pairs).toBe(1);
		expectAbsClose(bins[0].gamma, 18, 1e-14);
		expectAbsClose(bins[0].h, Math.SQRT2, 1e-15);
		const up = experimentalVariogram(s, { direction: { azimuth: 90, dip: -45 }, lag: 1.4, nLags: 1, lagTolerance: 0.7 });
		expect(up[0].pairs).toBe(1);
		expectAbsClose(up[0].gamma, 40.5, 1e-14);
	});

	it('experimentalVariogram(3D) bandwidths bound the offsets in plan and in the vertical plane', () => {
		// Along +y (azimuth 0, dip 0); the pair vector (1, 10, 0.5) is 6° off, offset 1 in plan, 0.5 vertically.
		const s: Sample[] = [
			{ x: 0, y: 0, z: 0, value: 0 },
			{ x: 1, y: 10, z: 0.5, value: 2 }
		];
		const o = { direction: { azimuth: 0, dip: 0 }, lag: 10, nLags: 1 } as const;
		expect(experimentalVariogram(s, o)[0].pairs).toBe(1);
		expect(experimentalVariogram(s, { ...o, bandwidth: 0.9 })[0].pairs).toBe(0);
		expect(experimentalVariogram(s, { ...o, verticalBandwidth: 0.4 })[0].pairs).toBe(0);
		expect(experimentalVariogram(s, { ...o, bandwidth: 1.1, verticalBandwidth: 0.6 })[0].pairs).toBe(1);
	});
});

/** The definition, all pairs, no windows: the reference the sweeps must reproduce. */
function bruteForce(samples: Sample[], o: ExperimentalOptions): LagBin[] {
	const tol = o.lagTolerance ?? o.lag / 2;
	const cnt = new Array(o.nLags).fill(0);
	const sh = new Array(o.nLags).fill(0);
	const sg = new Array(o.nLags).fill(0);
	const rad = Math.PI / 180;
	for (let i = 0; i < samples.length; i++) {
		for (let j = i + 1; j < samples.length; j++) {
			const a = samples[i];
			const b = samples[j];
			const dx = b.x - a.x;
			const dy = b.y - a.y;
			const dz = b.z - a.z;
			let h: number;
			if (o.direction === 'vertical') {
				if (a.sounding === undefined || a.sounding !== b.sounding) continue;
				h = Math.abs(dz);
			} else if (o.direction === 'horizontal') {
				if (a.sounding !== undefined && a.sounding === b.sounding) continue;
				if (Math.abs(dz) > (o.verticalBand ?? 0.1)) continue;
				h = Math.hypot(dx, dy);
				if (o.azimuth !== undefined) {
					const ang = Math.abs(((Math.atan2(dx, dy) / rad - o.azimuth) % 180 + 180) % 180);
					if (Math.min(ang, 180 - ang) > (o.angleTolerance ?? 22.5)) continue;
				}
			} else {
				h = Math.hypot(dx, dy, dz);
				const az = o.direction.azimuth * rad;
				const dip = o.direction.dip * rad;
				const d = [Math.sin(az) * Math.cos(dip), Math.cos(az) * Math.cos(dip), -Math.sin(dip)];
				const along = Math.abs(dx * d[0] + dy * d[1] + dz * d[2]);
				if (along < h * Math.cos((o.angleTolerance ?? 22.5) * rad)) continue;
			}
			for (let k = 1; k <= o.nLags; k++) {
				if (Math.abs(h - k * o.lag) <= tol) {
					cnt[k - 1]++;
					sh[k - 1] += h;
					sg[k - 1] += (b.value - a.value) ** 2;
				}
			}
		}
	}
	return cnt.map((n, k) => (n > 0 ? { h: sh[k] / n, gamma: sg[k] / (2 * n), pairs: n } : { h: (k + 1) * o.lag, gamma: NaN, pairs: 0 }));
}

describe('experimentalVariogram sweeps reproduce the all-pairs definition', () => {
	const rng = seedrandom('sweep-vs-brute');
	const samples: Sample[] = [];
	for (let s = 0; s < 12; s++) {
		const x = rng() * 60;
		const y = rng() * 60;
		// Elevations on a 0.05 grid so that many cross-sounding pairs fall inside a 0.1 band.
		for (let i = 0; i < 25; i++) samples.push({ x, y, z: -Math.round(rng() * 200) * 0.05, value: rng() * 10, sounding: `S${s}` });
	}
	const cases: [string, ExperimentalOptions][] = [
		['vertical', { direction: 'vertical', lag: 0.5, nLags: 12 }],
		['horizontal', { direction: 'horizontal', lag: 6, nLags: 10 }],
		['horizontal azimuth 40', { direction: 'horizontal', lag: 6, nLags: 10, azimuth: 40, angleTolerance: 30 }],
		['3D azimuth 120 dip 10', { direction: { azimuth: 120, dip: 10 }, lag: 4, nLags: 12, angleTolerance: 25 }],
		['vertical, overlapping bins', { direction: 'vertical', lag: 0.5, nLags: 12, lagTolerance: 0.6 }]
	];
	for (const [name, o] of cases) {
		it(`experimentalVariogram(${name}) equals the all-pairs count exactly and its sums to 1e-12 relative`, () => {
			const got = experimentalVariogram(samples, o);
			const ref = bruteForce(samples, o);
			expect(got.map((b) => b.pairs)).toEqual(ref.map((b) => b.pairs));
			expect(ref.some((b) => b.pairs > 0)).toBe(true);
			for (let k = 0; k < ref.length; k++) {
				if (ref[k].pairs === 0) continue;
				expectAbsClose(got[k].gamma, ref[k].gamma, 1e-12 * ref[k].gamma, `gamma[${k}]`);
				expectAbsClose(got[k].h, ref[k].h, 1e-12 * ref[k].h, `h[${k}]`);
			}
		});
	}
});

describe('experimentalVariogram on exactly simulated fields (Cholesky, Davis 1987)', () => {
	// Exponential model, sill 1, vertical practical range 1.5, horizontal 12 (REFERENCES.md practical-range form).
	const aV = 1.5;
	const aH = 12;
	const model = { structures: [{ type: 'exponential' as const, sill: 1, rangeMajor: aH, rangeMinor: aH, rangeVertical: aV }], azimuth: 0 };

	it('experimentalVariogram(vertical) of 24 simulated soundings is within 25 % of the model up to the range', () => {
		// Measured over 30 seeds with these settings: the largest relative deviation of bins 1..15 had mean 0.05,
		// sd 0.03, max 0.15; 25 % is above every seed seen and ~6 sd from the mean.
		const pts = Array.from({ length: 200 }, (_, i) => ({ x: 0, y: 0, z: -i * 0.1 }));
		const fields = choleskyFields(pts, model, 24, 'vertical-field');
		const samples: Sample[] = [];
		fields.forEach((f, r) => pts.forEach((p, i) => samples.push({ x: 1000 * r, y: 0, z: p.z, value: f[i], sounding: `S${r}` })));
		const bins = experimentalVariogram(samples, { direction: 'vertical', lag: 0.1, nLags: 15 });
		for (const b of bins) {
			const g = 1 - Math.exp((-3 * b.h) / aV);
			expectAbsClose(b.gamma / g, 1, 0.25, `h=${b.h}`);
		}
	});

	it('experimentalVariogram(horizontal) of 8 simulated 20 × 20 plan grids is within 25 % of the model up to half the range', () => {
		// Measured over 30 seeds: largest relative deviation of bins 1..6 mean 0.06, sd 0.03, max 0.13.
		const pts: { x: number; y: number; z: number }[] = [];
		for (let i = 0; i < 20; i++) for (let j = 0; j < 20; j++) pts.push({ x: 2 * i, y: 2 * j, z: 0 });
		const fields = choleskyFields(pts, model, 8, 'plan-field');
		const samples: Sample[] = [];
		fields.forEach((f, r) => pts.forEach((p, i) => samples.push({ x: p.x, y: p.y, z: 100 * r, value: f[i] })));
		const bins = experimentalVariogram(samples, { direction: 'horizontal', lag: 2, nLags: 6 });
		for (const b of bins) {
			const g = 1 - Math.exp((-3 * b.h) / aH);
			expectAbsClose(b.gamma / g, 1, 0.25, `h=${b.h}`);
		}
	});
});

describe('experimentalVariogram edge cases', () => {
	it('experimentalVariogram([]) and one sample give nLags empty bins', () => {
		for (const s of [[], [{ x: 0, y: 0, z: 0, value: 1, sounding: 'A' }]]) {
			const bins = experimentalVariogram(s, { direction: 'vertical', lag: 1, nLags: 3 });
			expect(bins.length).toBe(3);
			expect(bins.every((b) => b.pairs === 0 && Number.isNaN(b.gamma))).toBe(true);
		}
	});

	it('experimentalVariogram handles huge values without overflow to NaN', () => {
		const s: Sample[] = [
			{ x: 0, y: 0, z: 0, value: 1e150, sounding: 'A' },
			{ x: 0, y: 0, z: -1, value: -1e150, sounding: 'A' }
		];
		expectAbsClose(experimentalVariogram(s, { direction: 'vertical', lag: 1, nLags: 1 })[0].gamma, 2e300, 1e286);
	});

	it('experimentalVariogram rejects bad samples and options with short messages', () => {
		const s: Sample[] = [{ x: 0, y: 0, z: 0, value: NaN }];
		expect(() => experimentalVariogram(s, { direction: 'vertical', lag: 1, nLags: 1 })).toThrow('sample coordinates and values must be finite');
		expect(() => experimentalVariogram([], { direction: 'vertical', lag: 0, nLags: 1 })).toThrow('lag must be > 0');
		expect(() => experimentalVariogram([], { direction: 'vertical', lag: 1, nLags: 1.5 })).toThrow('nLags must be a positive integer');
		expect(() => experimentalVariogram([], { direction: 'vertical', lag: 1, nLags: 1, lagTolerance: -1 })).toThrow(RangeError);
		expect(() => experimentalVariogram([], { direction: 'horizontal', lag: 1, nLags: 1, angleTolerance: 120 })).toThrow('angleTolerance must be in (0, 90]');
		expect(() => experimentalVariogram([], { direction: 'horizontal', lag: 1, nLags: 1, bandwidth: 0 })).toThrow('bandwidth must be > 0');
		expect(() => experimentalVariogram([], { direction: 'sideways' as 'vertical', lag: 1, nLags: 1 })).toThrow(TypeError);
		expect(() => experimentalVariogram({} as Sample[], { direction: 'vertical', lag: 1, nLags: 1 })).toThrow('samples must be an array');
	});

	it('experimentalVariogram repeats bit for bit and does not mutate its samples', () => {
		const rng = seedrandom('repeat');
		const s: Sample[] = Array.from({ length: 200 }, (_, i) => ({ x: (i % 5) * 7, y: 0, z: -rng() * 10, value: rng(), sounding: `S${i % 5}` }));
		const copy = JSON.stringify(s);
		const o: ExperimentalOptions = { direction: 'horizontal', lag: 7, nLags: 4, verticalBand: 0.5 };
		const a = experimentalVariogram(s, o);
		const b = experimentalVariogram(s, o);
		expectSameBits(a.map((x) => x.gamma), b.map((x) => x.gamma));
		expectSameBits(a.map((x) => x.h), b.map((x) => x.h));
		expect(JSON.stringify(s)).toBe(copy);
	});
});
