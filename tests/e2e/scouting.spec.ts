import { expect, test } from '@playwright/test';
import AxeBuilder from '@axe-core/playwright';
import sharp from 'sharp';
import { CORN_8, SOYBEAN_8, eightyAcres, joinOwnFarm, ownFarm, ownField, ownPlan } from './own-farm';

test('an advisor adds a scouting note with a photo by clicking a lane, another by lane number; a viewer reads them and cannot add one', async ({ browser }) => {
	test.setTimeout(120_000);
	const owner = await (await browser.newContext()).newPage();
	const farm = await ownFarm(owner, 'scout-owner');
	const { boundary, guidance } = eightyAcres(-94.33, 43.73);
	const fieldId = await ownField(owner.request, farm.farmId, 'Scouted field', boundary);
	await ownPlan(owner.request, farm.farmId, fieldId, 2026, { guidance, pattern: [CORN_8, SOYBEAN_8], offsetFt: 0, headlandFt: 0 });
	const advisor = await joinOwnFarm(browser, owner, farm, 'advisor');
	const page = advisor.page;
	const url = `/farms/${farm.farmId}/fields/${fieldId}/seasons/2026/scouting`;

	await page.goto(url);
	await expect(page.getByRole('heading', { level: 1, name: 'Scouting notes · Scouted field · 2026' })).toBeVisible();
	const map = page.getByTestId('scout-map');
	await map.locator('.leaflet-overlay-pane canvas').first().waitFor();
	const box = (await map.boundingBox())!;
	await page.mouse.click(box.x + box.width / 2 + 3, box.y + box.height / 2 + 40);
	const message = page.getByTestId('pick-message');
	await expect(message).toHaveText(/^Lane \d+ \((corn|soybean)\), \d+ ft along it\.$/);
	const [, laneText, crop] = (await message.textContent())!.match(/^Lane (\d+) \((corn|soybean)\)/)!;
	await expect(page.getByLabel('Lane number', { exact: true })).toHaveValue(laneText);

	await page.getByLabel('Growth stage').fill('V6');
	await page.getByLabel('Pests').fill('Cutworm feeding on a few plants');
	// 8 rows in a 20-ft lane: 30-in rows, so 1/1,000 acre is 17 ft 5 in (extension stand-count tables).
	await expect(page.getByLabel('Row spacing (in)')).toHaveValue('30');
	await expect(page.getByTestId('thousandth-length')).toContainText('1/1,000 acre of 30-in row is 17 ft 5 in (17.42 ft).');
	await page.getByLabel('Plants counted').fill('32');
	await expect(page.getByTestId('plants-per-acre')).toHaveText('≈ 32,000 plants/ac from this count (a measurement, not a recommendation).');
	const jpeg = await sharp({ create: { width: 1200, height: 900, channels: 3, background: { r: 70, g: 130, b: 50 } } })
		.jpeg()
		.withExif({ IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '43/1 44/1 0/1', GPSLongitudeRef: 'W', GPSLongitude: '94/1 20/1 0/1' } })
		.toBuffer();
	await page.getByLabel(/^Photos \(JPEG/).setInputFiles({ name: 'cutworm.jpg', mimeType: 'image/jpeg', buffer: jpeg });
	await expect(page.getByRole('img', { name: 'Preview of cutworm.jpg' })).toBeVisible();
	await page.getByRole('button', { name: 'Save note' }).click();

	await expect(page.getByRole('status').filter({ hasText: 'Note saved.' })).toBeVisible();
	const note = page.getByTestId('scouting-note').filter({ has: page.getByRole('heading', { name: new RegExp(`^Lane ${laneText} · ${crop} · `) }) });
	await expect(note).toHaveCount(1);
	await expect(note.getByTestId('note-stand')).toHaveText('32,000 plants/ac (32 plants in 17.42 ft of 30-in row)');
	const photo = note.getByRole('img', { name: `Photo 1 of the note on lane ${laneText} (cutworm.jpg)` });
	await expect(photo).toBeVisible();
	expect(await photo.evaluate((img: HTMLImageElement) => img.naturalWidth)).toBe(400);
	const full = await page.request.get((await note.getByRole('link').first().getAttribute('href'))!);
	expect(full.headers()['content-type']).toBe('image/jpeg');
	expect(full.headers()['x-content-type-options']).toBe('nosniff');
	const meta = await sharp(await full.body()).metadata();
	expect(meta.width).toBe(1200);
	expect(meta.exif).toBeUndefined();

	// The keyboard way: lane number and distance, no map.
	await page.getByLabel('Lane number', { exact: true }).fill('3');
	await page.getByLabel('Position along lane (ft)').fill('150');
	await page.getByLabel('Weeds').fill('Waterhemp at the end rows');
	await page.getByRole('button', { name: 'Save note' }).click();
	await expect(page.getByRole('status').filter({ hasText: 'Note saved.' })).toBeVisible();
	const typed = page.getByTestId('scouting-note').filter({ has: page.getByRole('heading', { name: /^Lane 3 · corn · / }) });
	await expect(typed).toContainText('150 ft along the lane');
	await expect(typed).toContainText('Waterhemp at the end rows');

	// A lane that is not in the plan: refused beside the input, nothing saved.
	await page.getByLabel('Lane number', { exact: true }).evaluate((el: HTMLInputElement) => el.removeAttribute('max'));
	await page.getByLabel('Lane number', { exact: true }).fill('500');
	await page.getByRole('button', { name: 'Save note' }).click();
	await expect(page.getByRole('alert').filter({ hasText: /^Lane 500 is not in the season's plan \(lanes 1–\d+\)\.$/ })).toBeVisible();
	await expect(page.getByTestId('scouting-note')).toHaveCount(2);

	// The viewer, once granted the field, reads the notes and photos but has no form, and the API refuses them.
	const viewer = await joinOwnFarm(browser, owner, farm, 'viewer');
	await owner.goto(`/farms/${farm.farmId}/team`);
	const grants = owner.getByTestId(`grants-${viewer.email}`);
	await grants.getByLabel('Scouted field').check();
	await grants.getByRole('button', { name: /Save what/ }).click();
	await expect(owner.getByRole('status').filter({ hasText: 'now sees 1 field' })).toBeVisible();
	await viewer.page.goto(url);
	await expect(viewer.page.getByTestId('scouting-note')).toHaveCount(2);
	await expect(viewer.page.getByRole('img', { name: `Photo 1 of the note on lane ${laneText} (cutworm.jpg)` })).toBeVisible();
	await expect(viewer.page.getByRole('heading', { name: 'New note' })).toHaveCount(0);
	await expect(viewer.page.getByRole('button', { name: 'Save note' })).toHaveCount(0);
	const refused = await viewer.page.request.post(`/api/farms/${farm.farmId}/fields/${fieldId}/seasons/2026/scouting`, { data: { laneIndex: 0, observedAt: '2026-06-10T09:30:00-05:00' } });
	expect(refused.status()).toBe(403);
	expect((await refused.json()).error.code).toBe('forbidden');

	for (const p of [owner, page, viewer.page]) await p.context().close();
});

test('the scouting page on a phone: fits 375 px, passes an accessibility scan, and refuses a non-image beside the photo input', async ({ browser }) => {
	const context = await browser.newContext({ viewport: { width: 375, height: 812 } });
	const page = await context.newPage();
	const farm = await ownFarm(page, 'scout-phone');
	const { boundary, guidance } = eightyAcres(-94.35, 43.75);
	const fieldId = await ownField(page.request, farm.farmId, 'Phone field', boundary);
	await ownPlan(page.request, farm.farmId, fieldId, 2026, { guidance, pattern: [CORN_8, SOYBEAN_8], offsetFt: 0, headlandFt: 0 });
	const png = await sharp({ create: { width: 500, height: 300, channels: 3, background: { r: 120, g: 90, b: 40 } } }).png().toBuffer();
	// SvelteKit refuses form-encoded posts from another origin, so a multipart API client names its origin.
	const api = await page.request.post(`/api/farms/${farm.farmId}/fields/${fieldId}/seasons/2026/scouting`, {
		headers: { origin: new URL(page.url()).origin },
		multipart: { lane: '2', observedAt: '2026-07-01T10:00:00-05:00', growthStage: 'R1', plantsCounted: '120', photo: { name: 'pods.png', mimeType: 'image/png', buffer: png } }
	});
	expect(api.status(), await api.text()).toBe(201);
	const body = await api.json();
	expect(body.laneIndex).toBe(1);
	expect(body.standCount.plantsPerAcre).toBe(120000);
	expect(body.photos[0]).toMatchObject({ contentType: 'image/png', width: 500, height: 300 });

	const url = `/farms/${farm.farmId}/fields/${fieldId}/seasons/2026/scouting`;
	expect((await page.goto(url))?.status()).toBe(200);
	await expect(page.getByTestId('scouting-note')).toHaveCount(1);
	expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(375);
	const result = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).analyze();
	const serious = result.violations.filter((v) => v.impact === 'serious' || v.impact === 'critical').map((v) => `${v.id}: ${v.nodes.map((n) => n.target.join(' ')).slice(0, 3).join(', ')}`);
	expect(serious).toEqual([]);
	for (const button of await page.locator('main button:visible').all()) {
		expect((await button.boundingBox())!.height, (await button.textContent()) ?? '').toBeGreaterThanOrEqual(44);
	}

	await page.getByLabel('Lane number', { exact: true }).fill('4');
	await page.getByLabel(/^Photos \(JPEG/).setInputFiles({ name: 'leaf.jpg', mimeType: 'image/jpeg', buffer: Buffer.from('just text, not a picture\n'.repeat(20)) });
	await page.getByRole('button', { name: 'Save note' }).click();
	// Beside the photo input (the same text also heads the form).
	await expect(page.locator('p[role="alert"]').filter({ hasText: /^"leaf\.jpg" is not a JPEG, PNG or WebP photo \(judged by its content, not its name\)\.$/ })).toBeVisible();
	await expect(page.getByTestId('scouting-note')).toHaveCount(1);
	await context.close();
});
