/** The file formats the CPT parsers read. */
export type CptFileFormat = 'gef' | 'ags4' | 'delimited';

/**
 * Which parser a file needs: GEF when its first line starts with #GEFID, AGS4 when it starts with a GROUP row,
 * else by the file extension (.gef, .ags), else delimited text.
 */
export function detectFormat(text: string, file?: string): CptFileFormat {
	const start = text.replace(/^\uFEFF/, '').trimStart().slice(0, 64).toUpperCase();
	if (/^#\s*GEFID\s*=/.test(start)) return 'gef';
	if (/^"?GROUP"?\s*,/.test(start)) return 'ags4';
	const ext = file?.toLowerCase().split('.').pop();
	if (ext === 'gef') return 'gef';
	if (ext === 'ags') return 'ags4';
	return 'delimited';
}
