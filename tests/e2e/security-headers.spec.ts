import { expect, test } from '@playwright/test';
import { apiSignIn, DEMO_FARM_ID } from './helpers';

/** The policy as directive → sources. */
function parse(policy: string) {
	return Object.fromEntries(policy.split(';').map((d) => d.trim()).filter(Boolean).map((d) => {
		const [name, ...sources] = d.split(/\s+/);
		return [name, sources];
	}));
}

test('pages carry a nonce-based Content-Security-Policy with the tile host, and no HSTS over plain http', async ({ request }) => {
	await apiSignIn(request, 'owner');
	for (const path of ['/sign-in', `/farms/${DEMO_FARM_ID}/fields`]) {
		const res = await request.get(path);
		expect(res.status()).toBe(200);
		const headers = res.headers();
		const csp = parse(headers['content-security-policy']);
		const html = await res.text();
		const nonce = html.match(/<script nonce="([^"]+)"/)?.[1];
		expect(nonce).toMatch(/^[A-Za-z0-9+/=]{16,}$/);
		expect(csp['script-src']).toEqual(["'self'", `'nonce-${nonce}'`]);
		expect(csp['default-src']).toEqual(["'self'"]);
		expect(csp['style-src'][0]).toBe("'self'");
		expect(csp['style-src'].slice(1).every((s: string) => /^'(nonce|sha256)-/.test(s))).toBe(true);
		expect(csp['style-src-attr']).toEqual(["'unsafe-inline'"]);
		const tileHost = new URL(process.env.TILE_URL!.replace(/\{[a-z]\}/g, '0')).origin;
		expect(csp['img-src']).toEqual(["'self'", 'data:', 'blob:', tileHost]);
		expect(csp['object-src']).toEqual(["'none'"]);
		expect(csp['base-uri']).toEqual(["'self'"]);
		expect(csp['frame-ancestors']).toEqual(["'none'"]);
		expect(csp['form-action']).toEqual(["'self'"]);
		expect(Object.values(csp).flat()).not.toContain("'unsafe-eval'");
		expect(headers['strict-transport-security']).toBeUndefined();
		expect(headers['x-content-type-options']).toBe('nosniff');
		// Every inline script carries the nonce.
		const inline = [...html.matchAll(/<script(?![^>]*\bsrc=)([^>]*)>/g)].map((m) => m[1]);
		expect(inline.length).toBeGreaterThan(0);
		for (const attrs of inline) expect(attrs).toContain(`nonce="${nonce}"`);
	}
});
