import { describe, expect, it } from 'vitest';
import { HSTS, allowImageSource, applySecurityHeaders, tileSource } from '$lib/server/security-headers';

const pagePolicy = "default-src 'self'; img-src 'self' data: blob:; object-src 'none'";

describe('security headers', () => {
	it('sends HSTS over https only', () => {
		const overHttps = new Headers();
		applySecurityHeaders(overHttps, new URL('https://farm.example.test/farms'), null);
		expect(overHttps.get('strict-transport-security')).toBe('max-age=31536000');
		expect(HSTS).toBe('max-age=31536000');

		const overHttp = new Headers();
		applySecurityHeaders(overHttp, new URL('http://127.0.0.1:3000/farms'), null);
		expect(overHttp.get('strict-transport-security')).toBeNull();
	});

	it('always sends the fixed headers', () => {
		const headers = new Headers();
		applySecurityHeaders(headers, new URL('http://127.0.0.1:3000/'), null);
		expect(headers.get('x-content-type-options')).toBe('nosniff');
		expect(headers.get('referrer-policy')).toBe('same-origin');
		expect(headers.get('x-frame-options')).toBe('DENY');
		expect(headers.get('content-security-policy')).toBeNull();
	});

	it("adds the configured tile host to a page's img-src and nowhere else", () => {
		const headers = new Headers({ 'content-security-policy': pagePolicy });
		applySecurityHeaders(headers, new URL('http://127.0.0.1:3000/'), 'https://tiles.example.test/base/{z}/{x}/{y}.png?key=k');
		expect(headers.get('content-security-policy')).toBe("default-src 'self'; img-src 'self' data: blob: https://tiles.example.test; object-src 'none'");

		const noTiles = new Headers({ 'content-security-policy': pagePolicy });
		applySecurityHeaders(noTiles, new URL('http://127.0.0.1:3000/'), '');
		expect(noTiles.get('content-security-policy')).toBe(pagePolicy);
	});

	it('reads the tile source from a template, with a port or a subdomain placeholder', () => {
		expect(tileSource('http://127.0.0.1:8188/{z}/{x}/{y}.svg')).toBe('http://127.0.0.1:8188');
		expect(tileSource('https://{s}.tiles.example.test/{z}/{x}/{y}.png')).toBe('https://*.tiles.example.test');
		expect(tileSource('javascript:alert(1)//{z}')).toBeNull();
		expect(tileSource('not a url')).toBeNull();
		expect(tileSource(undefined)).toBeNull();
	});

	it('creates img-src when missing and does not repeat a source', () => {
		expect(allowImageSource("default-src 'self'", 'https://t.example.test')).toBe("default-src 'self'; img-src https://t.example.test");
		expect(allowImageSource("img-src 'self' https://t.example.test;", 'https://t.example.test')).toBe("img-src 'self' https://t.example.test");
	});
});
