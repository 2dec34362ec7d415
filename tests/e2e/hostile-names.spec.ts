import { expect, test, type Page } from '@playwright/test';
import { signUp, uniqueEmail } from './helpers';

// Names that would run script if any page wrote them in as HTML. Each says where it came from, so a
// dialog's message would name the leak.
const FIELD = '<img src=x onerror=alert("field")>';
const EXCLUSION = '<img src=x onerror=alert("exclusion")>';
const CROP = '<img src=x onerror=alert("crop")>';
const SHAPE = '<img src=x onerror=alert("kml")>';

const LNG = -94.52;
const LAT = 44.03;
const D = 0.006;
const ring = (x0: number, y0: number, x1: number, y1: number) => [[[x0, y0], [x1, y0], [x1, y1], [x0, y1], [x0, y0]]];
// The exclusion fills the middle third, so the centre of a field map lands on it.
const boundary = { type: 'Polygon', coordinates: ring(LNG, LAT, LNG + D, LAT + D) };
const exclusion = { type: 'Polygon', coordinates: ring(LNG + D / 3, LAT + D / 3, LNG + (2 * D) / 3, LAT + (2 * D) / 3) };

const escapeRegExp = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

/** Fails the test on any dialog or Content-Security-Policy report, once the page has been walked. */
function watch(page: Page) {
	const dialogs: string[] = [];
	const violations: string[] = [];
	page.on('dialog', (d) => {
		dialogs.push(d.message());
		void d.dismiss();
	});
	page.on('console', (m) => {
		if (m.type() === 'error' && /Content Security Policy/i.test(m.text())) violations.push(m.text());
	});
	return { dialogs, violations };
}

async function noMarkupFromNames(page: Page) {
	await expect(page.locator('img[src="x"]')).toHaveCount(0);
}

/** Hovers a point of a map, given as fractions of its box, and answers the tooltip shown. */
async function tooltipAt(page: Page, map: ReturnType<Page['getByRole']>, fx: number, fy: number) {
	const box = (await map.boundingBox())!;
	await page.mouse.move(box.x + box.width * fx - 3, box.y + box.height * fy);
	await page.mouse.move(box.x + box.width * fx, box.y + box.height * fy, { steps: 3 });
	const tip = map.locator('.leaflet-tooltip:not(.field-label)');
	await expect(tip).toHaveCount(1);
	return tip;
}

test('hostile field, exclusion, crop and imported shape names show as plain text on every page', async ({ page }) => {
	test.setTimeout(180_000);
	const seen = watch(page);
	await signUp(page, 'Careful Owner', uniqueEmail('hostile'));
	await page.goto('/farms');
	await page.getByLabel('Farm name').fill('Hostile Names test');
	await page.getByRole('button', { name: 'Create farm' }).click();
	await expect(page.getByRole('heading', { level: 1, name: 'Hostile Names test' })).toBeVisible();
	const farmId = new URL(page.url()).pathname.split('/')[2];

	const created = await page.request.post(`/api/farms/${farmId}/fields`, {
		data: { name: FIELD, boundary, exclusions: [{ name: EXCLUSION, kind: 'wet spot', geometry: exclusion }] }
	});
	expect(created.status()).toBe(201);
	const field = (await created.json()) as { id: string; name: string; acres: number };
	expect(field.name).toBe(FIELD);
	const plan = { guidance: { a: [LNG, LAT], b: [LNG, LAT + D] }, pattern: [{ kind: 'crop', crop: CROP, rows: 8, rowSpacingIn: 30 }], offsetFt: 0, headlandFt: 0, version: 0 };
	for (const season of [2026, 2027]) {
		const saved = await page.request.put(`/api/farms/${farmId}/fields/${field.id}/plans/${season}`, { data: plan });
		expect(saved.status()).toBe(200);
		expect(((await saved.json()) as { pattern: { crop: string }[] }).pattern[0].crop).toBe(CROP);
	}
	const base = `/farms/${farmId}/fields/${field.id}`;
	const lanePattern = new RegExp(`^Lane \\d+: ${escapeRegExp(CROP)}, 20\\.0 ft, \\d+\\.\\d\\d ac$`);

	// Fields list: the permanent map label and the table.
	await page.goto(`/farms/${farmId}/fields`);
	const listMap = page.getByRole('region', { name: 'Map of the fields' });
	await expect(listMap.locator('.field-label')).toHaveText(`${FIELD} · ${field.acres.toFixed(1)} ac`);
	await expect(page.getByTestId('fields-table').getByRole('link', { name: FIELD, exact: true })).toBeVisible();
	await expect(await tooltipAt(page, listMap, 0.5, 0.5)).toHaveText(EXCLUSION);
	await noMarkupFromNames(page);

	// Field page: heading, map label, exclusion tooltip and list.
	await page.goto(base);
	await expect(page.getByRole('heading', { level: 1 })).toHaveText(FIELD);
	const fieldMap = page.getByRole('region', { name: `Map of ${FIELD}` });
	await expect(fieldMap.locator('.field-label')).toHaveText(`${FIELD} (v1) · ${field.acres.toFixed(1)} ac`);
	await expect(await tooltipAt(page, fieldMap, 0.5, 0.5)).toHaveText(EXCLUSION);
	await expect(page.getByRole('listitem').filter({ hasText: EXCLUSION })).toHaveText(`${EXCLUSION} (wet spot)`);
	await noMarkupFromNames(page);

	// Plan page: a lane's tooltip names its crop; the pattern editor holds the name as a value.
	await page.goto(`${base}/plans/2026`);
	const planMap = page.getByRole('region', { name: `Lanes of ${FIELD} in 2026` });
	await expect(planMap).toBeVisible();
	await expect(await tooltipAt(page, planMap, 0.5, 0.2)).toHaveText(lanePattern);
	await expect(page.getByTestId('lane-table')).toContainText(CROP);
	await noMarkupFromNames(page);

	// Compare: both seasons' maps and the rotation matrix.
	await page.goto(`${base}/compare?a=2026&b=2027`);
	const compareMap = page.getByRole('region', { name: 'Lanes in 2027' });
	await expect(compareMap).toBeVisible();
	await expect(await tooltipAt(page, compareMap, 0.5, 0.2)).toHaveText(lanePattern);
	const firstMove = page.getByTestId('rotation-matrix').locator('tbody tr').first().locator('td');
	await expect(firstMove.nth(0)).toHaveText(CROP);
	await expect(firstMove.nth(1)).toHaveText(CROP);
	await noMarkupFromNames(page);

	// Seeding sheet.
	await page.goto(`${base}/plans/2026/sheet`);
	await expect(page.getByRole('heading', { level: 1 })).toHaveText(`Seeding sheet — ${FIELD} 2026`);
	await expect(page.getByTestId('sheet-lanes')).toContainText(CROP);
	await noMarkupFromNames(page);

	// Import preview: a KML <name> is the shape's label on the map and the value of its name box.
	await page.goto(`/farms/${farmId}/fields/import`);
	const kml = `<?xml version="1.0" encoding="UTF-8"?>
<kml xmlns="http://www.opengis.net/kml/2.2"><Document><Placemark><name>&lt;img src=x onerror=alert("kml")&gt;</name>
<Polygon><outerBoundaryIs><LinearRing><coordinates>${boundary.coordinates[0].map(([x, y]) => `${x},${y},0`).join(' ')}</coordinates></LinearRing></outerBoundaryIs></Polygon>
</Placemark></Document></kml>`;
	await page.getByLabel(/GeoJSON, KML, zipped Shapefile or ISO 11783-10 task data/).setInputFiles({ name: 'hostile.kml', mimeType: 'application/vnd.google-earth.kml+xml', buffer: Buffer.from(kml) });
	await page.getByRole('button', { name: 'Read the file' }).click();
	await expect(page.getByRole('heading', { name: 'Found 1 shape: choose and name the fields' })).toBeVisible();
	await expect(page.getByLabel('Name of shape 1')).toHaveValue(SHAPE);
	await expect(page.getByRole('region', { name: 'Shapes found in the file' }).locator('.field-label')).toHaveText(`${SHAPE} · ${field.acres.toFixed(1)} ac`);
	await noMarkupFromNames(page);

	expect(seen.dialogs).toEqual([]);
	expect(seen.violations).toEqual([]);
});
