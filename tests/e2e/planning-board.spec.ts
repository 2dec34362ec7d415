import { expect, test } from '@playwright/test';
import { CORN_8, SOYBEAN_8, eightyAcres, joinOwnFarm, ownFarm, ownField, ownPlan } from './own-farm';

const STRIPS = { pattern: [CORN_8, SOYBEAN_8], offsetFt: 0, headlandFt: 0 };

test('the planning board plans every missing field for next season and leaves planned fields alone', async ({ page, browser }) => {
	test.setTimeout(180_000);
	const farm = await ownFarm(page, 'board');
	const { farmId } = farm;
	const a = eightyAcres(-94.31, 43.71);
	const b = eightyAcres(-94.29, 43.71);
	const c = eightyAcres(-94.27, 43.71);
	const ready = await ownField(page.request, farmId, 'Ready 80', a.boundary);
	const done = await ownField(page.request, farmId, 'Done 80', b.boundary);
	await ownField(page.request, farmId, 'Bare 80', c.boundary);
	await ownPlan(page.request, farmId, ready, 2030, { guidance: a.guidance, ...STRIPS });
	await ownPlan(page.request, farmId, done, 2030, { guidance: b.guidance, ...STRIPS });
	const handMade = await ownPlan(page.request, farmId, done, 2031, { guidance: b.guidance, ...STRIPS, offsetFt: 5 });

	await page.goto(`/farms/${farmId}/planning?season=2031`);
	await expect(page.getByRole('heading', { level: 1 })).toHaveText('Planning board for 2031');
	const row = (name: string) => page.getByTestId('board-row').filter({ has: page.getByRole('rowheader', { name: new RegExp(`^${name}`) }) });
	await expect(row('Ready 80').getByTestId('board-state')).toContainText('No plan');
	await expect(row('Done 80').getByTestId('board-state')).toContainText('Adopted');
	await expect(row('Bare 80').getByTestId('board-state')).toContainText('No plan');
	await expect(row('Ready 80').getByRole('link', { name: 'Plan from 2030' })).toBeVisible();

	// A viewer reads the board but is not offered the batch.
	const viewer = await joinOwnFarm(browser, page, farm, 'viewer');
	await viewer.page.goto(`/farms/${farmId}/planning?season=2031`);
	await expect(viewer.page.getByRole('heading', { level: 1 })).toHaveText('Planning board for 2031');
	await expect(viewer.page.getByRole('button', { name: 'Plan 2031 for every field' })).toHaveCount(0);
	await viewer.page.context().close();

	// Inviting took the owner to the team page; back to the board.
	await page.goto(`/farms/${farmId}/planning?season=2031`);

	await page.getByRole('button', { name: 'Plan 2031 for every field' }).click();
	const summary = page.getByTestId('batch-summary');
	await expect(summary.getByRole('heading', { level: 2 })).toHaveText('Planned 2031: 1 new plan');
	await expect(summary.getByText(/^Ready 80: \d+ lanes, [\d.]+ ac, shifted one lane: 20\.00 ft to the right of A→B$/)).toBeVisible();
	await expect(summary.getByText('Done 80: already has a 2031 plan; left as it is', { exact: true })).toBeVisible();
	await expect(summary.getByText('Bare 80: no adopted 2030 plan to shift from', { exact: true })).toBeVisible();
	await expect(summary.getByRole('table', { name: 'Rotation of the new plans' })).toBeVisible();
	await expect(row('Ready 80').getByTestId('board-state')).toContainText('Adopted');

	// The hand-made 2031 plan is exactly as it was.
	const after = await (await page.request.get(`/api/farms/${farmId}/fields/${done}/plans/2031`)).json();
	expect(after.version).toBe(handMade.version);
	expect(after.offsetFt).toBe(5);
	await expect(page.getByRole('button', { name: 'Plan 2031 for every field' })).toBeDisabled();
});
