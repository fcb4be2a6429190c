// Shared tolerance helpers. Every float assertion names its tolerance through one of these.
import { expect } from 'vitest';

/** |actual − expected| ≤ abs. */
export function expectAbsClose(actual: number, expected: number, abs: number, label = ''): void {
	const err = Math.abs(actual - expected);
	if (!(err <= abs)) {
		expect.fail(`${label ? label + ': ' : ''}${actual} vs ${expected}: |error| ${err} > ${abs}`);
	}
}

/** |actual − expected| ≤ rel·|expected| (exact equality when expected is 0). */
export function expectRelClose(actual: number, expected: number, rel: number, label = ''): void {
	const err = Math.abs(actual - expected);
	if (!(err <= rel * Math.abs(expected))) {
		expect.fail(`${label ? label + ': ' : ''}${actual} vs ${expected}: relative error ${err / Math.abs(expected)} > ${rel}`);
	}
}

/** Element-wise |a[i] − b[i]| ≤ abs, with equal lengths. */
export function expectAllAbsClose(actual: ArrayLike<number>, expected: ArrayLike<number>, abs: number, label = ''): void {
	expect(actual.length, `${label} length`).toBe(expected.length);
	for (let i = 0; i < expected.length; i++) expectAbsClose(actual[i], expected[i], abs, `${label}[${i}]`);
}

/** Bit-for-bit equality of two float arrays (Object.is per element, so NaN equals NaN and −0 ≠ 0). */
export function expectSameBits(actual: ArrayLike<number>, expected: ArrayLike<number>, label = ''): void {
	expect(actual.length, `${label} length`).toBe(expected.length);
	for (let i = 0; i < expected.length; i++) {
		if (!Object.is(actual[i], expected[i])) expect.fail(`${label}[${i}]: ${actual[i]} is not bit-identical to ${expected[i]}`);
	}
}

/** Element-wise |a[i] − b[i]| ≤ abs where b[i] is a number, and a[i] NaN exactly where b[i] is NaN. */
export function expectAllAbsCloseOrNaN(actual: ArrayLike<number>, expected: ArrayLike<number>, abs: number, label = ''): void {
	expect(actual.length, `${label} length`).toBe(expected.length);
	for (let i = 0; i < expected.length; i++) {
		if (Number.isNaN(expected[i])) {
			if (!Number.isNaN(actual[i])) expect.fail(`${label}[${i}]: ${actual[i]} where NaN was expected`);
		} else expectAbsClose(actual[i], expected[i], abs, `${label}[${i}]`);
	}
}
