const BASE = 'http://conefield.invalid';

/**
 * A redirect target that is certain to stay on this site: a path that the URL parser resolves to this origin,
 * returned in its parsed form, or `fallback`. Refused: anything not starting with a single `/`, protocol-relative
 * `//host`, backslashes (browsers read `/\host` as `//host`), and control characters (browsers drop tabs and
 * newlines, so `/%09/host` would become `//host`).
 */
export function safeRedirectPath(target: unknown, fallback = '/projects'): string {
	if (typeof target !== 'string' || target.length === 0 || target.length > 2048) return fallback;
	// eslint-disable-next-line no-control-regex
	if (!/^\/(?![/\\])/.test(target) || /[\u0000-\u001f\u007f\\]/.test(target)) return fallback;
	let url: URL;
	try {
		url = new URL(target, BASE);
	} catch {
		return fallback;
	}
	if (url.origin !== BASE) return fallback;
	const path = url.pathname + url.search + url.hash;
	return path.startsWith('//') ? fallback : path;
}
