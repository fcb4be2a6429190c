/** zip-stream 7 ships no types: the part of its API Conefield uses (a Transform stream of ZIP bytes). */
declare module 'zip-stream' {
	import type { Readable } from 'node:stream';
	export interface ZipStreamOptions {
		zlib?: { level?: number };
		forceZip64?: boolean;
		store?: boolean;
		comment?: string;
	}
	export default class ZipStream extends Readable {
		constructor(options?: ZipStreamOptions);
		entry(source: Readable | Buffer | string, data: { name: string; date?: Date | string; store?: boolean }, callback: (err?: Error | null) => void): this;
		finalize(): void;
	}
}
