import { describe, expect, it } from 'vitest';
import { safeRedirectPath } from '$lib/redirect';

describe('safeRedirectPath(target)', () => {
	it('keeps a same-site path with its query and fragment', () => {
		expect(safeRedirectPath('/projects/abc/soundings?x=1#top')).toBe('/projects/abc/soundings?x=1#top');
		expect(safeRedirectPath('/')).toBe('/');
	});

	it('refuses targets a browser would send to another host', () => {
		for (const t of ['//evil.example', '/\\evil.example', '/\t/evil.example', '/\n/evil.example', '/\r\n/evil.example', '\\\\evil.example', 'https://evil.example', 'http:evil.example', 'javascript:alert(1)', ' /projects', '/\u0000/evil.example', '/\\/evil.example']) {
			expect(safeRedirectPath(t), JSON.stringify(t)).toBe('/projects');
		}
	});

	it('normalises dot segments and never returns a protocol-relative path', () => {
		expect(safeRedirectPath('/a/../b')).toBe('/b');
		expect(safeRedirectPath('/.//evil.example')).toBe('/projects');
	});

	it('returns the fallback for non-strings, empty and overlong input', () => {
		expect(safeRedirectPath(undefined)).toBe('/projects');
		expect(safeRedirectPath(['/projects'])).toBe('/projects');
		expect(safeRedirectPath('', '/signin')).toBe('/signin');
		expect(safeRedirectPath(`/${'a'.repeat(3000)}`)).toBe('/projects');
	});
});
