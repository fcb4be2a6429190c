import { describe, expect, it } from 'vitest';
import { csvResponse, streamResponse } from '../../src/lib/server/download';

const busy = (ms: number) => {
	const end = performance.now() + ms;
	while (performance.now() < end);
};

describe('streamResponse(chunks)', () => {
	it('lets other work in while a fast reader drains chunks made from memory (the event loop turns every few ms)', async () => {
		let made = 0;
		async function* chunks() {
			for (let i = 0; i < 120; i++) {
				busy(1);
				made++;
				yield `row ${i}\n`;
			}
		}
		let madeWhenOtherRan = -1;
		setImmediate(() => (madeWhenOtherRan = made));
		const res = streamResponse(chunks(), { filename: 'a b.csv', contentType: 'text/csv', abort: new AbortController() });
		expect(res.headers.get('content-disposition')).toBe('attachment; filename="a-b.csv"');
		const text = await res.text();
		expect(text.split('\n')).toHaveLength(121);
		// Without the turns, the other task would run only once all 120 chunks were made.
		expect(madeWhenOtherRan).toBeGreaterThanOrEqual(0);
		expect(madeWhenOtherRan).toBeLessThan(60);
	});

	it('a reader that cancels aborts the signal and closes the generator', async () => {
		let closed = false;
		async function* chunks() {
			try {
				for (;;) yield 'x';
			} finally {
				closed = true;
			}
		}
		const abort = new AbortController();
		const res = streamResponse(chunks(), { filename: 'x.csv', contentType: 'text/csv', abort });
		const reader = res.body!.getReader();
		await reader.read();
		await reader.cancel();
		expect(abort.signal.aborted).toBe(true);
		expect(closed).toBe(true);
	});
});

describe('csvResponse(chunks, filename)', () => {
	it('streams the chunks as CSV under a safe file name (download.csv when nothing is left of it)', async () => {
		const res = csvResponse(['a,b\r\n', '1,2\r\n'].values(), 'Levee site: readings.csv');
		expect(res.headers.get('content-type')).toBe('text/csv; charset=utf-8');
		expect(res.headers.get('content-disposition')).toBe('attachment; filename="Levee-site-readings.csv"');
		expect(await res.text()).toBe('a,b\r\n1,2\r\n');
		expect(csvResponse([].values(), '堤防').headers.get('content-disposition')).toBe('attachment; filename="download.csv"');
	});
});
