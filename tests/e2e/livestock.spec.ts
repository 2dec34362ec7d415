import { expect, test } from '@playwright/test';
import { CORN_8, PASTURE_10, eightyAcres, ownFarm, ownField, ownPlan } from './own-farm';

test('on a phone: a shelter moves to the next stretch in one tap, and the map and rest days follow', async ({ browser }) => {
	const context = await browser.newContext({ viewport: { width: 375, height: 812 } });
	const page = await context.newPage();
	const farm = await ownFarm(page, 'grazier');
	const { boundary, guidance } = eightyAcres(-94.33, 43.72);
	const fieldId = await ownField(page.request, farm.farmId, 'Shelter strips', boundary);
	const plan = await ownPlan(page.request, farm.farmId, fieldId, 2026, { guidance, pattern: [CORN_8, PASTURE_10], offsetFt: 0, headlandFt: 30 });
	const lane = plan.lanes.find((l: { kind: string }) => l.kind === 'pasture').index as number;

	// A mobile shelter from the equipment list, added through its own page.
	await page.goto(`/farms/${farm.farmId}/equipment/new`);
	await page.getByLabel('Name', { exact: true }).fill('Ewe hut');
	await page.getByLabel('Kind of implement').selectOption('shelter');
	await page.getByLabel('Shelter width (ft)').fill('10');
	await page.locator('#f-lengthFt').fill('20');
	await page.getByRole('button', { name: 'Save implement' }).click();
	await expect(page.getByRole('status')).toHaveText('Saved Ewe hut.');

	const group = await page.request.post(`/api/farms/${farm.farmId}/livestock/groups`, { data: { name: 'Ewes', species: 'sheep', head: 30, averageWeightLb: 150 } });
	expect(group.status()).toBe(201);
	const groupId = (await group.json()).id;
	const shelters = await page.request.get(`/api/farms/${farm.farmId}/livestock/moves?season=2026`);
	expect(await shelters.json()).toEqual([]);

	// The first move through the page's own form.
	await page.goto(`/farms/${farm.farmId}/livestock?field=${fieldId}&season=2026&date=2026-06-01`);
	await expect(page.getByTestId('livestock-caution')).toContainText('The label is the law');
	const form = page.getByTestId('move-form');
	await form.getByLabel('Group').selectOption(groupId);
	await form.getByLabel('Pasture lane').selectOption(String(lane));
	await form.getByLabel('From (date)').fill('2026-06-01');
	await form.getByLabel('To (date, included)').fill('2026-06-02');
	await form.getByLabel('Stretch starts at (ft along the lane)').fill('0');
	await form.getByLabel('Stretch ends at (ft along the lane)').fill('200');
	await form.getByLabel('Shelter').selectOption({ label: 'Ewe hut' });
	await form.getByLabel('Forage above residual (lb DM/ac)').fill('2400');
	await form.getByLabel('Daily intake (% of body weight)').fill('3.5');
	// 30 ewes × 150 lb × 3.5 % = 157.5 lb/day; 2 days ÷ (2,400 × 50 %) = 0.2625 ac; on a 10-ft lane ≈ 1,143 ft (NCAT ATTRA, Grazier's Math).
	await expect(page.getByTestId('stretch-needed')).toContainText(/needs about 1,1[0-9]{2} ft of lane/);
	await form.getByRole('button', { name: 'Log the move' }).click();
	await expect(page.getByRole('status')).toHaveText(`Moved Ewes to Lane ${lane + 1}, 0–200 ft, Jun 1, 2026 – Jun 2, 2026.`);

	const card = page.getByTestId('group-card').filter({ hasText: 'Ewes' });
	await expect(card.getByTestId('group-now')).toHaveText(`On the date shown: Lane ${lane + 1}, 0–200 ft (Jun 1, 2026 – Jun 2, 2026)`);
	await expect(page.getByTestId('shelter-positions')).toHaveText(`Ewe hut (Ewes): Lane ${lane + 1}, 0–200 ft; path of 1 move this season`);
	const rows = page.getByTestId('rest-row');
	await expect(rows).toHaveCount(1);
	await expect(rows.nth(0).locator('td')).toHaveText([`Lane ${lane + 1}, 0–200 ft`, '—', '—', 'Grazing now']);
	await expect(page.locator('.shelter-marker')).toHaveText('Ewe hut');

	// One tap: on to the next stretch.
	const next = card.getByRole('button', { name: 'Move Ewes to the next stretch' });
	const box = await next.boundingBox();
	expect(box!.height).toBeGreaterThanOrEqual(44);
	await next.click();
	await expect(page.getByRole('status')).toHaveText(`Moved Ewes to Lane ${lane + 1}, 200–400 ft, Jun 3, 2026 – Jun 4, 2026.`);
	await expect(page).toHaveURL(/date=2026-06-03/);
	await expect(card.getByTestId('group-now')).toHaveText(`On the date shown: Lane ${lane + 1}, 200–400 ft (Jun 3, 2026 – Jun 4, 2026)`);
	await expect(page.getByTestId('shelter-positions')).toHaveText(`Ewe hut (Ewes): Lane ${lane + 1}, 200–400 ft; path of 2 moves this season`);
	await expect(rows).toHaveCount(2);
	await expect(rows.nth(0).locator('td')).toHaveText([`Lane ${lane + 1}, 0–200 ft`, 'Jun 3, 2026', '0 d', 'Resting: 0 of 40 d']);
	await expect(rows.nth(1).locator('td')).toHaveText([`Lane ${lane + 1}, 200–400 ft`, '—', '—', 'Grazing now']);

	// Two days on, the first stretch has rested 2 days.
	await page.getByLabel('Date shown').fill('2026-06-05');
	await page.getByRole('button', { name: 'Show' }).click();
	await expect(rows.nth(0).locator('td')).toHaveText([`Lane ${lane + 1}, 0–200 ft`, 'Jun 3, 2026', '2 d', 'Resting: 2 of 40 d']);
	await expect(rows.nth(1).locator('td')).toHaveText([`Lane ${lane + 1}, 200–400 ft`, 'Jun 5, 2026', '0 d', 'Resting: 0 of 40 d']);

	const width = await page.evaluate(() => document.documentElement.scrollWidth);
	expect(width).toBeLessThanOrEqual(375);
	await context.close();
});
