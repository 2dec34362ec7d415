import { expect, test } from '@playwright/test';
import { CORN_8, SOYBEAN_8, eightyAcres, ownFarm, ownField, ownPlan } from './own-farm';

test('20 parallel "plan next season" posts over HTTP: one 201, nineteen 409, all within seconds', async ({ page }) => {
	const { farmId } = await ownFarm(page, 'race');
	const { boundary, guidance } = eightyAcres(-94.35, 43.74);
	const fieldId = await ownField(page.request, farmId, 'Race field', boundary);
	await ownPlan(page.request, farmId, fieldId, 2026, { guidance, pattern: [CORN_8, SOYBEAN_8], offsetFt: 0, headlandFt: 0 });

	const started = Date.now();
	const answers = await Promise.all(
		Array.from({ length: 20 }, () => page.request.post(`/api/farms/${farmId}/fields/${fieldId}/plans/2026/next`, { data: { shift: 'default' }, timeout: 30_000 }))
	);
	const seconds = (Date.now() - started) / 1000;
	expect(answers.map((r) => r.status()).sort()).toEqual([201, ...Array(19).fill(409)]);
	expect(seconds).toBeLessThan(15);
	const refused = await Promise.all(answers.filter((r) => r.status() === 409).map((r) => r.json()));
	expect(refused.every((b) => b.error.code === 'already_planned' && b.error.message === '2027 already has a plan. Open it, or name a new variant.')).toBe(true);
	const plan = await (await page.request.get(`/api/farms/${farmId}/fields/${fieldId}/plans/2027`)).json();
	expect(plan).toMatchObject({ season: 2027, version: 1, offsetFt: 20 });
});
