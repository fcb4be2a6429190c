/**
 * The one way the app writes dates: day, month in words, year ("2 Dec 2026"), with the time on a 24-hour
 * clock where it matters ("2 Dec 2026, 15:04"). Month names are our own list, not the runtime's locale data,
 * so the server and every browser write the same text.
 */

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'] as const;

type DateLike = Date | string | number;

interface Parts {
	year: number;
	month: number;
	day: number;
	hours: number;
	minutes: number;
}

function partsOf(value: DateLike, utc: boolean): Parts | null {
	const d = value instanceof Date ? value : new Date(value);
	if (Number.isNaN(d.getTime())) return null;
	return utc
		? { year: d.getUTCFullYear(), month: d.getUTCMonth(), day: d.getUTCDate(), hours: d.getUTCHours(), minutes: d.getUTCMinutes() }
		: { year: d.getFullYear(), month: d.getMonth(), day: d.getDate(), hours: d.getHours(), minutes: d.getMinutes() };
}

/** "2 Dec 2026" in the reader's time zone (or UTC); "—" for null, undefined or an invalid date. */
export function formatDate(value: DateLike | null | undefined, { utc = false }: { utc?: boolean } = {}): string {
	const p = value === null || value === undefined ? null : partsOf(value, utc);
	return p ? `${p.day} ${MONTHS[p.month]} ${p.year}` : '—';
}

/**
 * "2 Dec 2026, 15:04" in the reader's time zone, or "2 Dec 2026, 15:04 UTC"; with `shortThisYear`, "2 Dec, 15:04"
 * for a date in the current year (lists of recent events). "—" for null, undefined or an invalid date.
 */
export function formatDateTime(
	value: DateLike | null | undefined,
	{ utc = false, shortThisYear = false, now = new Date() }: { utc?: boolean; shortThisYear?: boolean; now?: Date } = {}
): string {
	const p = value === null || value === undefined ? null : partsOf(value, utc);
	if (!p) return '—';
	const hm = `${String(p.hours).padStart(2, '0')}:${String(p.minutes).padStart(2, '0')}`;
	const year = shortThisYear && p.year === partsOf(now, utc)!.year ? '' : ` ${p.year}`;
	return `${p.day} ${MONTHS[p.month]}${year}, ${hm}${utc ? ' UTC' : ''}`;
}
