import { describe, expect, it } from 'vitest';
import { safeRedirectTarget } from '../../src/lib/server/redirects';

describe('redirect target after sign-in', () => {
	it('keeps same-origin paths with their query and fragment', () => {
		expect(safeRedirectTarget('/farms/abc/team')).toBe('/farms/abc/team');
		expect(safeRedirectTarget('/invitations/tok_123?x=1#top')).toBe('/invitations/tok_123?x=1#top');
		expect(safeRedirectTarget('/farms/a%20b')).toBe('/farms/a%20b');
	});

	// Each of these is what URLSearchParams.get hands us for a crafted ?redirectTo= value.
	it.each([
		['//evil.example', 'protocol-relative'],
		['/\\evil.example', 'backslash read as a slash'],
		['\\/evil.example', 'leading backslash'],
		['/\t/evil.example', 'tab that browsers drop (%09)'],
		['/\n/evil.example', 'newline (%0A)'],
		['/\r/evil.example', 'carriage return (%0D)'],
		['/%2F%2Fevil.example', 'double-encoded slashes'],
		['/%2F/evil.example', 'one encoded slash'],
		['/%5Cevil.example', 'encoded backslash'],
		['/%09/evil.example', 'encoded tab left in the value'],
		['https://evil.example', 'absolute URL'],
		['http:/evil.example', 'scheme with one slash'],
		['javascript:alert(1)', 'script URL'],
		['/%E0%A4%A', 'broken percent-encoding'],
		['/farms\u0000', 'NUL byte'],
		['', 'empty'],
		['farms', 'relative path']
	])('refuses %j (%s)', (value) => {
		expect(safeRedirectTarget(value)).toBe('/farms');
	});

	it('falls back when nothing is given', () => {
		expect(safeRedirectTarget(null)).toBe('/farms');
		expect(safeRedirectTarget(undefined)).toBe('/farms');
	});

	it('reads the tab case exactly as SvelteKit hands it over from the query string', () => {
		const url = new URL('http://127.0.0.1:3000/sign-in?redirectTo=/%09/evil.example');
		expect(url.searchParams.get('redirectTo')).toBe('/\t/evil.example');
		expect(safeRedirectTarget(url.searchParams.get('redirectTo'))).toBe('/farms');
	});
});
