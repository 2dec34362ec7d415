import { expect, test } from '@playwright/test';
import { ownFarm } from './own-farm';

// 0.004° on each side of the 180th meridian at 17° S: written the short way round, the ring jumps
// from +179.998 to −179.998 longitude.
const acrossDateLine = { type: 'Polygon', coordinates: [[[179.998, -17.01], [-179.998, -17.01], [-179.998, -17], [179.998, -17], [179.998, -17.01]]] };
const dateLineMessage = 'crosses the 180th meridian (the date line) near latitude -17.0100; a field must lie on one side of it. Split it there into two fields.';

test('a pasted boundary across the date line is refused while drawing and on save, and nothing is stored', async ({ page }) => {
	const { farmId } = await ownFarm(page, 'dateline');
	await page.goto(`/farms/${farmId}/fields/new`);
	await page.getByText('Type or paste the boundary as GeoJSON').click();
	await page.getByLabel('GeoJSON Polygon (longitude, latitude)').fill(JSON.stringify(acrossDateLine));
	await page.getByRole('button', { name: 'Use this boundary' }).click();
	await expect(page.getByTestId('measure')).toContainText(`The field boundary ${dateLineMessage}`);
	await page.getByLabel('Field name').fill('Over the line');
	await page.getByRole('button', { name: 'Save field' }).click();
	await expect(page.getByRole('alert').filter({ hasText: 'crosses the 180th meridian' }).first()).toBeVisible();
	const fields = await page.request.get(`/api/farms/${farmId}/fields`);
	expect(await fields.json()).toEqual([]);
});

test('the field API refuses the same outline with 400 on boundary', async ({ page }) => {
	const { farmId } = await ownFarm(page, 'dateline-api');
	const res = await page.request.post(`/api/farms/${farmId}/fields`, { data: { name: 'Over the line', boundary: acrossDateLine } });
	expect(res.status()).toBe(400);
	expect((await res.json()).error.fields).toEqual({ boundary: [`The field boundary ${dateLineMessage}`] });
});

test('a layout preview with a 1e300-ft offset answers 400 at once instead of never', async ({ page }) => {
	await ownFarm(page, 'offset');
	const boundary = { type: 'Polygon', coordinates: [[[-94.3, 43.8], [-94.29, 43.8], [-94.29, 43.807], [-94.3, 43.807], [-94.3, 43.8]]] };
	const res = await page.request.post('/api/layout-preview', {
		data: { boundary, guidance: { a: [-94.3, 43.8], b: [-94.3, 43.807] }, pattern: [{ kind: 'crop', crop: 'corn', widthFt: 20 }], offsetFt: 1e300, headlandFt: 500 },
		timeout: 10_000
	});
	expect(res.status()).toBe(400);
	const body = await res.json();
	expect(body.error.code).toBe('invalid');
	expect(Object.keys(body.error.fields)).toEqual(['offsetFt']);
	// The same field with a sane offset is laid out by the worker pool.
	const ok = await page.request.post('/api/layout-preview', {
		data: { boundary, guidance: { a: [-94.3, 43.8], b: [-94.3, 43.807] }, pattern: [{ kind: 'crop', crop: 'corn', widthFt: 20 }], offsetFt: 0, headlandFt: 500 }
	});
	expect(ok.status()).toBe(200);
	// ~2,641 ft east–west less two 500-ft headlands leaves ~1,641 ft: 82 whole 20-ft lanes and a part lane.
	expect((await ok.json()).lanes).toHaveLength(83);
});
