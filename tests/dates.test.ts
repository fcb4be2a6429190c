import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { formatDate, formatDateTime } from '../src/lib/dates';

describe('formatDate(value) and formatDateTime(value)', () => {
	it('formatDate writes the day, the month in words and the year', () => {
		expect(formatDate('2026-12-02T10:30:00Z', { utc: true })).toBe('2 Dec 2026');
		expect(formatDate(new Date(2026, 1, 12))).toBe('12 Feb 2026');
		expect(formatDate(Date.UTC(2025, 8, 30), { utc: true })).toBe('30 Sep 2025');
	});

	it('formatDateTime adds a 24-hour time, and says UTC when asked for it', () => {
		expect(formatDateTime('2026-12-02T15:04:59Z', { utc: true })).toBe('2 Dec 2026, 15:04 UTC');
		expect(formatDateTime(new Date(2026, 0, 5, 7, 3))).toBe('5 Jan 2026, 07:03');
	});

	it('formatDateTime(v, {shortThisYear}) leaves out the year of a date in the current year only', () => {
		const now = new Date(2026, 11, 20);
		expect(formatDateTime(new Date(2026, 11, 2, 4, 45), { shortThisYear: true, now })).toBe('2 Dec, 04:45');
		expect(formatDateTime(new Date(2025, 11, 2, 4, 45), { shortThisYear: true, now })).toBe('2 Dec 2025, 04:45');
	});

	it('formatDate and formatDateTime write a dash for no date or an invalid one', () => {
		for (const v of [null, undefined, 'not a date', NaN]) {
			expect(formatDate(v)).toBe('—');
			expect(formatDateTime(v)).toBe('—');
		}
	});
});

describe('one date format everywhere', () => {
	function files(dir: string): string[] {
		return readdirSync(dir).flatMap((name) => {
			const p = join(dir, name);
			return statSync(p).isDirectory() ? files(p) : /\.(ts|svelte)$/.test(name) ? [p] : [];
		});
	}

	it('no page or service formats a date itself: they all go through $lib/dates', () => {
		const src = join(import.meta.dirname, '..', 'src');
		const offenders = files(src).filter((f) => !f.endsWith(join('lib', 'dates.ts')) && /new Date\([^)]*\)\.toLocale|toLocale(Date|Time)String\(|toISOString\(\)\.slice|DateTimeFormat|dateStyle|month:\s*'/.test(readFileSync(f, 'utf8')));
		expect(offenders).toEqual([]);
	});
});
