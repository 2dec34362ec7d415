// The reports page of a farm of the test's own: the acreage table with its warning and totals,
// the CSV beside it, a field's season summary, and its task data download.
import { expect, test } from '@playwright/test';
import JSZip from 'jszip';
import { CORN_8, eightyAcres, ownFarm, ownField, ownPlan } from './own-farm';

test('reports page: acreage by field and crop, CSV, season summary and ISO 11783-10 download', async ({ page }) => {
	const season = new Date().getFullYear() + 1;
	const farm = await ownFarm(page, 'report-owner');
	const { boundary, guidance } = eightyAcres(-94.41, 43.74);
	const fieldId = await ownField(page.request, farm.farmId, 'Wide twins', boundary);
	const plan = await ownPlan(page.request, farm.farmId, fieldId, season, {
		guidance,
		pattern: [{ kind: 'crop', crop: 'corn', rows: 12, rowSpacingIn: 60, twinSpacingIn: 8 }, CORN_8],
		offsetFt: 0,
		headlandFt: 0
	});
	const api = await (await page.request.get(`/api/farms/${farm.farmId}/reports/acreage?season=${season}`)).json();
	expect(api.rows).toHaveLength(1);
	const cornAcres = (plan.lanes as { acres: number }[]).reduce((s, l) => s + l.acres, 0);
	expect(api.totals.corn.plantedAcres).toBeCloseTo(cornAcres, 2);

	await page.goto(`/farms/${farm.farmId}/reports?season=${season}`);
	await expect(page.getByRole('heading', { level: 2, name: `Crop acreage ${season}` })).toBeVisible();
	await expect(page.getByRole('list', { name: 'Warnings' }).getByRole('listitem')).toHaveText([
		`Wide twins: no planting record for corn in ${season}; log the planting in the record book so the report carries its date.`
	]);
	const row = page.getByTestId('acreage-table').locator('tbody tr');
	await expect(row).toHaveCount(1);
	await expect(row.getByRole('cell')).toHaveText([
		'— / — / —',
		'Wide twins',
		'corn',
		'grain',
		'wide rows (60 in rows)',
		'no record',
		`${api.rows[0].plantedAcres.toFixed(2)} ac`,
		`${api.rows[0].creditedAcres.toFixed(2)} ac`
	]);

	const csv = await page.request.get(`/api/farms/${farm.farmId}/reports/acreage.csv?season=${season}`);
	expect(csv.headers()['content-type']).toBe('text/csv; charset=utf-8');
	expect((await csv.text()).split('\r\n')[1]).toBe(`,,,Wide twins,,corn,grain,wide rows,60,,${api.rows[0].plantedAcres},${api.rows[0].creditedAcres}`);

	await page.getByRole('link', { name: 'Season summary of Wide twins' }).click();
	await expect(page.getByRole('heading', { level: 1, name: `Wide twins · ${season} season summary` })).toBeVisible();
	await expect(page.getByTestId('crop-acres').locator('tbody tr').getByRole('cell')).toHaveText(['corn', String(plan.lanes.length), `${api.rows[0].plantedAcres.toFixed(2)} ac`, `${api.rows[0].creditedAcres.toFixed(2)} ac`]);
	await expect(page.getByText(`No records were logged on this field for ${season}.`, { exact: true })).toBeVisible();

	await page.goto(`/farms/${farm.farmId}/reports?season=${season}`);
	const download = page.waitForEvent('download');
	await page.getByRole('link', { name: 'ISO 11783-10 task data of Wide twins' }).click();
	const file = await (await download).path();
	const { readFile } = await import('node:fs/promises');
	const zip = await JSZip.loadAsync(await readFile(file));
	const xml = await zip.file('TASKDATA/TASKDATA.XML')!.async('string');
	expect(xml).toMatch(/<ISO11783_TaskData [^>]*VersionMajor="4"/);
	expect(xml).toContain('<GPN A="GPN1" B="A-B ' + season + '" C="1">');
});
