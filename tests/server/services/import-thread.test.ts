import { afterAll, describe, expect, it } from 'vitest';
import { formatDelimited, type DelimitedMapping, type ParsedSounding } from '../../../src/lib/cpt';
import { parseUpload, type ParseRequest } from '../../../src/lib/server/services/import-parse';
import { parseUploadOffThread, stopImportWorker } from '../../../src/lib/server/services/import-thread';

const MAPPING: DelimitedMapping = { id: 'sounding', depth: 'depth (m)', qc: 'qc (MPa)', fs: 'fs (kPa)', u2: 'u2 (kPa)', units: { depth: 'm', qc: 'MPa', fs: 'kPa', u2: 'kPa' }, groundElevation: { value: 2 } };

function big(soundings: number, readings: number): ParseRequest {
	const list: ParsedSounding[] = Array.from({ length: soundings }, (_, k) => {
		const depth = Float64Array.from({ length: readings }, (_, i) => Math.round((i + 1) * 5) / 1000);
		return { id: `B-${k}`, depth, qc: depth.map((d) => 1000 + 100 * d + k), fs: depth.map((d) => 10 + d), u2: depth.map((d) => 5 * d) };
	});
	return { files: [{ name: 'big.csv', bytes: new TextEncoder().encode(formatDelimited(list)) }], mapping: MAPPING };
}

/** How many 5 ms timer ticks this thread ran while `work` was in progress. */
async function ticksDuring(work: () => unknown): Promise<number> {
	let ticks = 0;
	const timer = setInterval(() => ticks++, 5);
	await new Promise((r) => setTimeout(r, 0));
	ticks = 0;
	await work();
	clearInterval(timer);
	return ticks;
}

afterAll(() => stopImportWorker());

describe('parseUploadOffThread(request)', () => {
	it('parseUploadOffThread gives the same files, problems and bits as parseUpload in this thread', async () => {
		const request = big(3, 2000);
		request.files.push({ name: 'bad.csv', bytes: new TextEncoder().encode('sounding,depth (m)\nX,abc') });
		const here = parseUpload(request);
		const there = await parseUploadOffThread(request);
		expect(there.problems).toEqual(here.problems);
		expect(there.parsed.map((f) => [f.index, f.format, f.sha256])).toEqual(here.parsed.map((f) => [f.index, f.format, f.sha256]));
		for (const [i, f] of there.parsed.entries()) {
			for (const [k, s] of f.soundings.entries()) {
				const h = here.parsed[i].soundings[k];
				expect(s.id).toBe(h.id);
				expect(Buffer.from(s.qc.buffer).equals(Buffer.from(h.qc.buffer))).toBe(true);
				expect(Buffer.from(s.depth.buffer).equals(Buffer.from(h.depth.buffer))).toBe(true);
			}
		}
	});

	it('this thread keeps running timers while a large upload is parsed off it, and none while it parses itself', async () => {
		const request = big(10, 40_000);
		await parseUploadOffThread(big(1, 10));
		const offThread = await ticksDuring(() => parseUploadOffThread(request));
		const inThread = await ticksDuring(() => parseUpload(request));
		expect(inThread).toBe(0);
		expect(offThread).toBeGreaterThan(5);
	}, 60_000);
});
