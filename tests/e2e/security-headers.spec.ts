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

test('the drawing tools, plan map, sheet and PDF work under the policy, with nothing refused', async ({ page }) => {
	test.setTimeout(120_000);
	const refused: string[] = [];
	page.on('console', (m) => {
		if (m.type() === 'error' && /Content Security Policy/i.test(m.text())) refused.push(m.text());
	});
	page.on('pageerror', (e) => refused.push(e.message));
	await apiSignIn(page.request, 'owner');
	const creek = `/farms/${DEMO_FARM_ID}/fields/5a1e0000-0000-4000-8000-0000000001f2`;

	// Drawing a boundary (geoman) on the new-field page.
	await page.goto(`/farms/${DEMO_FARM_ID}/fields/new`);
	const map = page.getByRole('region', { name: 'Boundary drawing map' });
	await expect(map.locator('.leaflet-map-pane')).toHaveCount(1);
	await page.getByRole('button', { name: 'Draw boundary' }).click();
	const box = (await map.boundingBox())!;
	const corners: [number, number][] = [[0.2, 0.2], [0.4, 0.2], [0.4, 0.45], [0.2, 0.45], [0.2, 0.2]];
	for (const [x, y] of corners) await page.mouse.click(box.x + box.width * x, box.y + box.height * y);
	await expect(page.getByTestId('field-acres')).toHaveText(/^\d+\.\d\d ac$/);
	// Moving points puts geoman's vertex handles on the map.
	await page.getByRole('button', { name: 'Move points' }).click();
	await expect(map.locator('.marker-icon').first()).toBeVisible();

	// The plan map draws lanes on canvas, tiles from the tile host, and the A-B markers.
	await page.goto(`${creek}/plans/2026`);
	const planMap = page.getByRole('region', { name: /^Lanes of Creek Bend in 2026$/ });
	await expect(planMap.locator('canvas')).toHaveCount(1);
	await expect(planMap.locator('.ab-marker')).toHaveCount(2);
	await expect(planMap.locator('img.leaflet-tile-loaded').first()).toBeVisible();

	await page.goto(`${creek}/plans/2026/sheet`);
	await expect(page.getByTestId('sheet-lanes')).toBeVisible();
	const pdf = await page.request.get(`/api/farms/${DEMO_FARM_ID}/fields/5a1e0000-0000-4000-8000-0000000001f2/plans/2026/sheet.pdf`);
	expect(pdf.status()).toBe(200);
	expect(pdf.headers()['content-type']).toBe('application/pdf');
	// A page policy on the PDF would keep the browser's own viewer from showing it.
	expect(pdf.headers()['content-security-policy']).toBeUndefined();

	expect(refused).toEqual([]);
});
