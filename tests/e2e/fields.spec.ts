import { expect, test } from '@playwright/test';
import { recordingContext, signUp, uniqueEmail } from './helpers';
import { CORN_8, SOYBEAN_8, ownFarm, ownField, ownPlan } from './own-farm';
import { rectangle } from '../fixtures/rectangle';

test('draw a field by clicking corners on the map, see its acres, save it', async ({ browser }) => {
	const { context, hosts } = await recordingContext(browser);
	const page = await context.newPage();
	// A farm of its own, so no other field decides where the map opens.
	await signUp(page, 'Drawing Tester', uniqueEmail('drawer'));
	await page.getByLabel('Farm name').fill('Drawing test farm');
	await page.getByRole('button', { name: 'Create farm' }).click();
	await page.getByRole('link', { name: 'Fields' }).first().click();
	await page.getByRole('link', { name: 'Draw a field' }).click();
	const map = page.getByRole('region', { name: 'Boundary drawing map' });
	await expect(map.locator('.leaflet-map-pane')).toHaveCount(1);
	// From the overview of the region down to field scale (zoom 6 → 15).
	// Each step waits for the zoom animation to end: a click during one is taken from the old zoom.
	for (let i = 0; i < 9; i++) {
		await map.getByRole('button', { name: 'Zoom in' }).click();
		await expect(map.locator('.leaflet-zoom-anim')).toHaveCount(0);
	}
	// Field scale: the scale bar reads in feet, not miles.
	await expect(map.locator('.leaflet-control-scale-line').last()).toHaveText(/^\d+ ft$/);
	await page.getByRole('button', { name: 'Draw boundary' }).click();
	const box = (await map.boundingBox())!;
	const corners: [number, number][] = [[0.15, 0.15], [0.35, 0.15], [0.35, 0.4], [0.15, 0.4]];
	for (const [x, y] of corners) await page.mouse.click(box.x + box.width * x, box.y + box.height * y);
	await page.mouse.click(box.x + box.width * corners[0][0], box.y + box.height * corners[0][1]);
	const acres = page.getByTestId('field-acres');
	await expect(acres).toHaveText(/^\d+\.\d\d ac$/);
	const drawn = parseFloat((await acres.textContent())!);
	expect(drawn).toBeGreaterThan(1);

	// Undo brings back the empty map; draw again.
	await page.getByRole('button', { name: 'Undo' }).click();
	await expect(page.getByText('No boundary yet')).toBeVisible();
	await page.getByRole('button', { name: 'Draw boundary' }).click();
	for (const [x, y] of corners) await page.mouse.click(box.x + box.width * x, box.y + box.height * y);
	await page.mouse.click(box.x + box.width * corners[0][0], box.y + box.height * corners[0][1]);
	await expect(acres).toHaveText(`${drawn.toFixed(2)} ac`);

	await page.getByLabel('Field name').fill('Drawn in test');
	await page.getByRole('button', { name: 'Save field' }).click();
	await expect(page.getByRole('heading', { level: 1, name: 'Drawn in test' })).toBeVisible();
	await expect(page.getByTestId('field-acres')).toHaveText(`${drawn.toFixed(2)} ac`);
	await expect(page.getByTestId('boundary-history')).toContainText('Version 1');
	expect([...hosts]).toEqual(['127.0.0.1']);
	await context.close();
});

test('import a KML and a zipped Shapefile, pick and name the fields', async ({ page }) => {
	const { farmId } = await ownFarm(page, 'importer');
	await page.goto(`/farms/${farmId}/fields/import`);
	await page.getByLabel(/GeoJSON, KML, zipped Shapefile or ISO 11783-10 task data/).setInputFiles('tests/fixtures/import/two-fields.kml');
	await page.getByRole('button', { name: 'Read the file' }).click();
	await expect(page.getByRole('heading', { name: /Found 2 shapes/ })).toBeVisible();
	await page.getByLabel('Import shape 2').uncheck();
	await page.getByLabel('Name of shape 1').fill('From KML');
	await page.getByRole('button', { name: 'Create the ticked fields' }).click();
	await expect(page).toHaveURL(new RegExp(`/farms/${farmId}/fields$`));
	await expect(page.getByTestId('fields-table')).toContainText('From KML');

	await page.goto(`/farms/${farmId}/fields/import`);
	await page.getByLabel(/GeoJSON, KML, zipped Shapefile or ISO 11783-10 task data/).setInputFiles('tests/fixtures/import/utm15n-shapefile.zip');
	await page.getByRole('button', { name: 'Read the file' }).click();
	await expect(page.getByRole('heading', { name: /Found \d+ shapes?/ })).toBeVisible();
	const first = page.getByLabel('Name of shape 1');
	await first.fill('From shapefile');
	await page.getByRole('button', { name: 'Create the ticked fields' }).click();
	await expect(page.getByTestId('fields-table')).toContainText('From shapefile');

	// A file that is not what it says is refused on the page, nothing stored.
	await page.goto(`/farms/${farmId}/fields/import`);
	await page.getByLabel(/GeoJSON, KML, zipped Shapefile or ISO 11783-10 task data/).setInputFiles({ name: 'not-a-zip.zip', mimeType: 'application/zip', buffer: Buffer.from('just some text') });
	await page.getByRole('button', { name: 'Read the file' }).click();
	await expect(page.getByRole('alert')).toContainText('not a zip');
});

test('edit a boundary and see the old version kept', async ({ page }) => {
	const { farmId } = await ownFarm(page, 'editor');
	// 1,320 × 1,980 ft is 60 ac; the rectangle helper is good to about 0.1 %.
	const boundary = rectangle(1320, 1980, -94.2051, 43.9062);
	const fieldId = await ownField(page.request, farmId, 'Creek test', boundary);
	const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
	await ownPlan(page.request, farmId, fieldId, 2025, { guidance: { a: sw, b: nw }, pattern: [CORN_8, SOYBEAN_8], offsetFt: 0, headlandFt: 30 });
	const fieldUrl = `/farms/${farmId}/fields/${fieldId}`;
	await page.goto(`${fieldUrl}/edit`);
	await expect(page.getByTestId('field-acres')).toHaveText(/^(59\.9\d|60\.0\d) ac$/);
	const geo = { type: 'Polygon', coordinates: [[[-94.2051, 43.9062], [-94.1990, 43.9062], [-94.1990, 43.9110], [-94.2051, 43.9110], [-94.2051, 43.9062]]] };
	await page.getByText('Type or paste the boundary as GeoJSON').click();
	await page.getByLabel('GeoJSON Polygon (longitude, latitude)').fill(JSON.stringify(geo));
	await page.getByRole('button', { name: 'Use this boundary' }).click();
	const newAcres = await page.getByTestId('field-acres').textContent();
	expect(newAcres).not.toMatch(/^(59\.9|60\.0)/);
	await page.getByLabel('Why the outline changed (optional)').fill('New drainage ditch on the north side');
	await page.getByRole('button', { name: 'Save changes' }).click();
	await expect(page.getByTestId('boundary-history')).toContainText('Version 2');
	await expect(page.getByTestId('boundary-history')).toContainText('New drainage ditch on the north side');
	await expect(page.getByTestId('field-acres')).toHaveText(newAcres!.replace(' ac', '') + ' ac');
	await page.getByRole('link', { name: 'Version 1' }).click();
	await expect(page.getByText('Showing boundary version 1 of 2')).toBeVisible();

	// Plans laid out before the edit keep their boundary.
	await page.goto(`${fieldUrl}/plans/2025`);
	await expect(page.getByText('This plan was laid out on boundary version 1; the field now has version 2.')).toBeVisible();
});

test('a drawing that crosses itself is refused with a message saying where', async ({ page }) => {
	const { farmId } = await ownFarm(page, 'bowtie');
	await page.goto(`/farms/${farmId}/fields/new`);
	await page.getByText('Type or paste the boundary as GeoJSON').click();
	const bowtie = { type: 'Polygon', coordinates: [[[-94.3, 43.8], [-94.29, 43.81], [-94.29, 43.8], [-94.3, 43.81], [-94.3, 43.8]]] };
	await page.getByLabel('GeoJSON Polygon (longitude, latitude)').fill(JSON.stringify(bowtie));
	await page.getByRole('button', { name: 'Use this boundary' }).click();
	await expect(page.getByTestId('measure')).toContainText('crosses itself near longitude -94.295000, latitude 43.80500');
	await page.getByLabel('Field name').fill('Bow tie');
	await page.getByRole('button', { name: 'Save field' }).click();
	await expect(page.getByRole('alert').filter({ hasText: 'crosses itself' }).first()).toBeVisible();
	await page.goto(`/farms/${farmId}/fields`);
	await expect(page.getByText('Bow tie')).toHaveCount(0);
});
