// A manager makes a field-day tour on its page; a visitor with no account opens the link on a
// phone-width screen and sees the map, lanes, stops and notes and nothing else; a revoked link is gone.
import { expect, test } from '@playwright/test';
import AxeBuilder from '@axe-core/playwright';
import { CORN_8, SOYBEAN_8, eightyAcres, ownFarm, ownField, ownPlan } from './own-farm';

test('a visitor opens a tour on a phone without an account; a revoked link answers 404', async ({ page, browser }) => {
	const season = new Date().getFullYear() + 1;
	const farm = await ownFarm(page, 'tour-owner');
	const { boundary, guidance } = eightyAcres(-94.33, 43.72);
	const shown = await ownField(page.request, farm.farmId, 'Tour strips', boundary);
	await ownPlan(page.request, farm.farmId, shown, season, { guidance, pattern: [CORN_8, SOYBEAN_8], offsetFt: 0, headlandFt: 0 });
	// A second field that is not on the tour: the visitor must never see it.
	const hidden = eightyAcres(-94.36, 43.72);
	await ownField(page.request, farm.farmId, 'Private back forty', hidden.boundary);

	await page.goto(`/farms/${farm.farmId}/tours/new`);
	await page.getByLabel('Tour title', { exact: true }).fill('Summer strip walk');
	await page.getByLabel('Tour date').fill(`${season}-07-15`);
	await page.getByLabel(/Link works until/).fill(`${season}-07-31T18:00`);
	await page.getByRole('checkbox', { name: 'Tour strips' }).check();
	const [sw] = boundary.coordinates[0] as [number, number][];
	const stops = [
		{ title: 'Corn beside soybean', note: 'Outside rows get more light.', lat: sw[1] + 0.002, lng: sw[0] + 0.001 },
		{ title: 'Border rows', note: 'Compare the middle rows.', lat: sw[1] + 0.004, lng: sw[0] + 0.002 },
		{ title: 'Turn row', note: '', lat: sw[1] + 0.006, lng: sw[0] + 0.003 }
	];
	for (const [i, s] of stops.entries()) {
		await page.getByLabel(`Latitude, stop ${i + 1}`, { exact: true }).fill(String(s.lat));
		await page.getByLabel(`Longitude, stop ${i + 1}`, { exact: true }).fill(String(s.lng));
		await page.getByLabel(`Title, stop ${i + 1}`, { exact: true }).fill(s.title);
		await page.getByLabel(`Note, stop ${i + 1}`, { exact: true }).fill(s.note);
	}
	await page.getByRole('button', { name: 'Create tour and link' }).click();
	await expect(page.getByRole('heading', { name: 'Tour ready: Summer strip walk' })).toBeVisible();
	const url = (await page.getByTestId('share-url').textContent())!.trim();
	expect(url).toMatch(/\/share\/[A-Za-z0-9_-]{43}$/);

	// The visitor: a fresh browser with no cookies, phone width.
	const visitor = await browser.newContext({ viewport: { width: 375, height: 740 }, isMobile: true, hasTouch: true });
	const phone = await visitor.newPage();
	const answer = await phone.goto(url);
	expect(answer?.status()).toBe(200);
	await expect(phone.getByRole('heading', { level: 1, name: 'Summer strip walk' })).toBeVisible();
	await expect(phone.getByRole('region', { name: 'Tour map: fields, lanes and numbered stops' })).toBeVisible();
	await expect(phone.locator('.leaflet-container canvas')).toHaveCount(1);
	await expect(phone.locator('.tour-stop')).toHaveCount(3);
	await expect(phone.getByRole('list', { name: 'Crops on the map' }).getByRole('listitem')).toHaveText(['corn', 'soybean']);
	const stopHeadings = phone.getByRole('list', { name: 'Tour stops' }).getByRole('heading', { level: 2 });
	await expect(stopHeadings).toHaveText([/^1\s*Stop 1: Corn beside soybean$/, /^2\s*Stop 2: Border rows$/, /^3\s*Stop 3: Turn row$/]);
	await expect(phone.getByText('Outside rows get more light.', { exact: true })).toBeVisible();
	// Nothing else of the farm: no farm menu, no other field, no member, no record.
	await expect(phone.getByRole('navigation', { name: 'Main' })).toHaveCount(0);
	const text = await phone.locator('body').innerText();
	for (const secret of ['Private back forty', farm.email, 'Test tour-owner', farm.farmName, 'Records', 'Team']) expect(text).not.toContain(secret);
	await expect(phone.locator(`a[href^="/farms"]`)).toHaveCount(0);
	// Usable on the phone: the page does not scroll sideways.
	expect(await phone.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(375);
	expect(await visitor.cookies()).toEqual([]);
	const axe = await new AxeBuilder({ page: phone }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).exclude('.leaflet-pane').analyze();
	expect(axe.violations.map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`)).toEqual([]);
	// The link opens no API door.
	expect((await phone.request.get(`/api/farms/${farm.farmId}/reports/acreage?season=${season}`)).status()).toBe(401);

	// The printable sheet: one QR card per stop, drawn on the server as data: images.
	await phone.getByRole('link', { name: 'Printable sheet with a QR code per stop' }).click();
	const qrs = phone.getByRole('img', { name: /QR code that opens stop \d of the tour/ });
	await expect(qrs).toHaveCount(3);
	for (const src of await qrs.evaluateAll((imgs) => imgs.map((i) => i.getAttribute('src')))) expect(src).toMatch(/^data:image\/png;base64,/);

	// The owner revokes the link; the visitor's next visit finds nothing.
	await page.goto(`/farms/${farm.farmId}/tours`);
	const row = page.getByTestId('tours-table').getByRole('row', { name: /Summer strip walk/ });
	await expect(row.getByRole('cell').nth(4)).toHaveText(/^Link works until /);
	await row.getByRole('button', { name: 'Revoke the link of Summer strip walk' }).click();
	await expect(page.getByRole('status')).toHaveText('The link was revoked; visitors now get "not available".');
	await expect(row.getByRole('cell').nth(4)).toHaveText('Revoked');
	const gone = await phone.goto(url);
	expect(gone?.status()).toBe(404);
	await expect(phone.getByRole('heading', { level: 1, name: 'Tour not available' })).toBeVisible();
	expect((await phone.request.get(`${url}/print`)).status()).toBe(404);
	await visitor.close();
});
