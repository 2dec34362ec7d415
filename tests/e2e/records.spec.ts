import { expect, test, type APIRequestContext } from '@playwright/test';
import Papa from 'papaparse';
import { CORN_8, SOYBEAN_8, eightyAcres, ownFarm, ownField, ownPlan } from './own-farm';

// Records cannot be dated in the future, so the test works in this year's season.
const SEASON = new Date().getUTCFullYear();

async function product(request: APIRequestContext, farmId: string, data: object): Promise<string> {
	const res = await request.post(`/api/farms/${farmId}/products`, { data });
	expect(res.status(), await res.text()).toBe(201);
	return (await res.json()).id;
}

test('log a spraying pass on all corn lanes from the form, see it on the season, its restrictions, CSV, edit, delete and restore', async ({ page }) => {
	const { farmId } = await ownFarm(page, 'records');
	const { boundary, guidance } = eightyAcres();
	const fieldId = await ownField(page.request, farmId, 'Record 80', boundary);
	const plan = await ownPlan(page.request, farmId, fieldId, SEASON, { guidance, pattern: [CORN_8, SOYBEAN_8], offsetFt: 0, headlandFt: 0 });
	await product(page.request, farmId, { name: 'post herbicide Q', kind: 'herbicide', unit: 'pt', epaRegNo: '1234-56', reiHours: 12, phiDays: 30, grazingDays: 14 });
	const cornLanes: { index: number; acres: number }[] = plan.lanes.filter((l: { crop: string }) => l.crop === 'corn');
	const cornAcres = cornLanes.reduce((s, l) => s + l.acres, 0);
	const base = `/farms/${farmId}/fields/${fieldId}/seasons/${SEASON}`;

	await page.goto(`${base}/records/new`);
	await expect(page.getByRole('heading', { level: 1, name: 'New record' })).toBeVisible();
	await page.getByLabel('Type of work').selectOption('spraying');
	await expect(page.getByTestId('pesticide-caution')).toHaveText('The label is the law. This is a record, not a recommendation. Follow local rules and licensed practice.');

	// End before start: refused beside the input, nothing saved.
	const hourAgo = new Date(Date.now() - 3_600_000);
	await page.getByRole('button', { name: 'All corn lanes' }).click();
	await expect(page.getByLabel('Lane numbers')).toHaveValue(cornLanes.map((l) => l.index + 1).join(', '));
	await page.getByLabel('Product 1').selectOption({ label: 'post herbicide Q' });
	await page.getByLabel('Rate').first().fill('1.5');
	await expect(page.getByLabel('Unit').first()).toHaveValue('pt/ac');
	await page.getByLabel('Applicator', { exact: true }).fill('Test applicator');
	await page.getByLabel('Started (farm time)').fill('2020-01-02T10:00');
	await page.getByLabel('Ended (farm time)').fill('2020-01-01T10:00');
	await page.getByRole('button', { name: 'Save record' }).click();
	await expect(page.getByText('The work cannot end before it started.')).toBeVisible();
	expect((await (await page.request.get(`/api/farms/${farmId}/fields/${fieldId}/seasons/${SEASON}/records`)).json()).records).toEqual([]);

	// The farm keeps America/Chicago time, whatever the browser's zone: type the farm's clock an hour ago.
	const chicago = (d: Date) => new Intl.DateTimeFormat('sv-SE', { timeZone: 'America/Chicago', year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit' }).format(d).replace(' ', 'T');
	await page.getByLabel('Started (farm time)').fill(chicago(new Date(hourAgo.getTime() - 3_600_000)));
	await page.getByLabel('Ended (farm time)').fill(chicago(hourAgo));
	await page.getByRole('button', { name: 'Save record' }).click();
	await expect(page.getByRole('status').filter({ hasText: 'Record saved.' })).toBeVisible();
	await expect(page.getByTestId('record-acres')).toHaveText(`${cornAcres.toLocaleString('en-US', { maximumFractionDigits: 2 })} ac`);
	await expect(page.getByTestId('pesticide-caution')).toBeVisible();
	const row = page.getByTestId('product-row');
	await expect(row.getByRole('cell').nth(0)).toHaveText('post herbicide Q');
	await expect(row.getByRole('cell').nth(2)).toHaveText('1.5 pt/ac');
	const recordUrl = page.url().split('?')[0];

	// Season view: the record in the timeline, corn lanes closed on the map, the calendar lists re-entry.
	await page.goto(base);
	await expect(page.getByTestId('record-item')).toHaveCount(1);
	await expect(page.getByTestId('no-entry-legend')).toBeVisible();
	const calendar = page.getByTestId('restrictions-calendar');
	await expect(calendar.getByRole('row').filter({ hasText: 'Re-entry' })).toHaveCount(1);
	await expect(calendar.getByRole('row').filter({ hasText: 'Harvest' })).toHaveCount(1);
	// A soybean lane's own history is empty; a corn lane's has the pass.
	await page.goto(`${base}?lane=2`);
	await expect(page.getByRole('heading', { name: 'History of lane 2' })).toBeVisible();
	await expect(page.getByTestId('no-records')).toHaveText('No record matches these filters.');
	await page.goto(`${base}?lane=1`);
	await expect(page.getByTestId('record-item')).toHaveCount(1);
	await page.getByLabel('Type').selectOption('planting');
	await page.getByRole('button', { name: 'Show' }).click();
	await expect(page.getByTestId('no-records')).toBeVisible();

	// CSV export.
	const csv = await page.request.get(`/api/farms/${farmId}/fields/${fieldId}/seasons/${SEASON}/records.csv`);
	expect(csv.status()).toBe(200);
	const rows = Papa.parse<string[]>((await csv.text()).trim()).data;
	expect(rows).toHaveLength(2);
	expect(rows[1][5]).toBe(`lanes ${cornLanes.map((l) => l.index + 1).join(', ')}`);
	expect(rows[1].slice(8, 13)).toEqual(['post herbicide Q', '1234-56', 'no', '1.5', 'pt/ac']);

	// Edit, then delete and restore; the history shows each step.
	await page.goto(recordUrl);
	await page.getByText('Edit this record').click();
	await page.getByLabel('Notes').fill('Boom height checked');
	await page.getByRole('button', { name: 'Save changes' }).click();
	await expect(page.getByRole('status').filter({ hasText: 'Record saved.' })).toBeVisible();
	await page.getByRole('button', { name: 'Delete record' }).click();
	await expect(page.getByTestId('deleted-notice')).toBeVisible();
	await page.getByRole('button', { name: 'Restore record' }).click();
	await expect(page.getByTestId('deleted-notice')).toHaveCount(0);
	const history = page.getByTestId('history-entry');
	await expect(history).toHaveCount(4);
	await expect(history.nth(0)).toContainText('Logged by Test records');
	await expect(history.nth(1)).toContainText('Edited by Test records');
	await expect(history.nth(1)).toContainText('Notes: (blank) → "Boom height checked"');
	await expect(history.nth(2)).toContainText('Deleted by');
	await expect(history.nth(3)).toContainText('Restored by');
});

test('the farm record book lists the field\'s season and links to it', async ({ page }) => {
	const { farmId } = await ownFarm(page, 'bookhub');
	const { boundary, guidance } = eightyAcres();
	const fieldId = await ownField(page.request, farmId, 'Hub field', boundary);
	await ownPlan(page.request, farmId, fieldId, SEASON, { guidance, pattern: [CORN_8, SOYBEAN_8], offsetFt: 0, headlandFt: 0 });
	await page.goto(`/farms/${farmId}/records`);
	await expect(page.getByRole('heading', { level: 1, name: 'Record book' })).toBeVisible();
	await page.getByTestId('record-book-grid').getByRole('link', { name: `Hub field, ${SEASON}: 0 records` }).click();
	await expect(page.getByRole('heading', { level: 1 })).toHaveText(`Hub field · ${SEASON} season`);
	await expect(page.getByRole('link', { name: 'Products' }).or(page.getByRole('link', { name: 'Download CSV' })).first()).toBeVisible();
});

test('a planting record is filled from the seeding sheet in one step: type, lanes, variety and population', async ({ page }) => {
	const { farmId } = await ownFarm(page, 'records-from-sheet');
	const { boundary, guidance } = eightyAcres();
	const fieldId = await ownField(page.request, farmId, 'Sheet fill 80', boundary);
	const first = await ownPlan(page.request, farmId, fieldId, SEASON, { guidance, pattern: [CORN_8, SOYBEAN_8], offsetFt: 0, headlandFt: 0 });
	const corn: number[] = first.lanes.filter((l: { crop: string }) => l.crop === 'corn').map((l: { index: number }) => l.index);
	const put = await page.request.put(`/api/farms/${farmId}/fields/${fieldId}/plans/${SEASON}`, {
		data: { guidance, pattern: [CORN_8, SOYBEAN_8], offsetFt: 0, headlandFt: 0, version: first.version, assignments: corn.map((laneIndex) => ({ laneIndex, variety: 'test hybrid 104', populationPerAcre: 34_000 })) }
	});
	expect(put.status(), await put.text()).toBe(200);
	const base = `/farms/${farmId}/fields/${fieldId}/seasons/${SEASON}`;
	// Lane numbers as the form writes them: runs of consecutive lanes joined with a hyphen.
	const numbers = corn.map((i) => i + 1);

	await page.goto(`${base}/records/new`);
	await page.getByRole('button', { name: `corn: test hybrid 104, 34,000 seeds/ac (${corn.length} lanes)` }).click();
	await expect(page.getByLabel('Type of work')).toHaveValue('planting');
	await expect(page.getByLabel('Variety')).toHaveValue('test hybrid 104');
	await expect(page.getByLabel('Population (seeds/ac)')).toHaveValue('34000');
	await expect(page.getByLabel('Lane numbers')).toHaveValue(numbers.join(', '));

	const chicago = (d: Date) => new Intl.DateTimeFormat('sv-SE', { timeZone: 'America/Chicago', year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit' }).format(d).replace(' ', 'T');
	const hourAgo = new Date(Date.now() - 3_600_000);
	await page.getByLabel('Started (farm time)').fill(chicago(new Date(hourAgo.getTime() - 3_600_000)));
	await page.getByLabel('Ended (farm time)').fill(chicago(hourAgo));
	await page.getByRole('button', { name: 'Save record' }).click();
	await expect(page.getByRole('status').filter({ hasText: 'Record saved.' })).toBeVisible();

	const { records } = await (await page.request.get(`/api/${base.slice(1)}/records`)).json();
	expect(records).toHaveLength(1);
	expect(records[0].type).toBe('planting');
	expect(records[0].laneIndexes).toEqual(corn);
	expect(records[0].details).toMatchObject({ variety: 'test hybrid 104', populationPerAcre: 34_000 });
});
