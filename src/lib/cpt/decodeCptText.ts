import { assertFileSize, CptParseError } from './errors';

/**
 * Turns an uploaded file's bytes into text for the parsers: rejects files over MAX_FILE_BYTES and binary
 * files (a NUL byte outside UTF-16), decodes UTF-16 when a byte-order mark says so, UTF-8 when the bytes are
 * valid UTF-8, and Windows-1252 otherwise (older GEF and CSV exports are often in that code page).
 *
 * @throws CptParseError with code 'file-too-large' or 'binary-file'.
 */
export function decodeCptText(bytes: Uint8Array, file?: string): string {
	if (!(bytes instanceof Uint8Array)) throw new TypeError('bytes must be a Uint8Array');
	assertFileSize(bytes.byteLength, file);
	if (bytes.length >= 2 && bytes[0] === 0xff && bytes[1] === 0xfe) return new TextDecoder('utf-16le').decode(bytes);
	if (bytes.length >= 2 && bytes[0] === 0xfe && bytes[1] === 0xff) return new TextDecoder('utf-16be').decode(bytes);
	const nul = bytes.indexOf(0);
	if (nul >= 0) {
		let line = 1;
		for (let i = 0; i < nul; i++) if (bytes[i] === 10) line++;
		throw new CptParseError({ code: 'binary-file', file, line, detail: 'file is binary, not text' });
	}
	try {
		return new TextDecoder('utf-8', { fatal: true }).decode(bytes);
	} catch {
		return new TextDecoder('windows-1252').decode(bytes);
	}
}
