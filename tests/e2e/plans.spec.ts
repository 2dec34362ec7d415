import { expect, test } from '@playwright/test';
import { DEMO_FARM_ID, apiSignIn, recordingContext, signIn } from './helpers';
import { CORN_8, SOYBEAN_8, eightyAcres, ownFarm, ownField, ownPlan } from './own-farm';

const NORTH80 = `/farms/${DEMO_FARM_ID}/fields/5a1e0000-0000-4000-8000-0000000001f1`;

// Lane counts by hand for the 1,320-ft-wide test field: 8/8 strips (20-ft lanes) 5 ft right of the
// west edge with a 40-ft headland leave 40–1,280 ft to plant, cut into the lanes from 25–45 ft to
// 1,265–1,285 ft: 63 lanes. 12/12 strips (30-ft lanes) on the same offset: 35–65 ft to 1,265–1,295 ft,
// 42 lanes; with an 80-ft headland (80–1,240 ft) 65–95 ft to 1,235–1,265 ft, 40 lanes.
const EIGHT_EIGHT = { pattern: [CORN_8, SOYBEAN_8], offsetFt: 5, headlandFt: 40 };

test('open a field, change the pattern, watch lanes and acres update, save, plan next season, scroll back', async ({ browser }) => {
	const { context, hosts } = await recordingContext(browser);
	const page = await context.newPage();
	const { farmId } = await ownFarm(page, 'planner');
	const { boundary, guidance } = eightyAcres();
	const fieldId = await ownField(page.request, farmId, 'Home 80', boundary);
	await ownPlan(page.request, farmId, fieldId, 2025, { guidance, ...EIGHT_EIGHT });
	await ownPlan(page.request, farmId, fieldId, 2027, { guidance, ...EIGHT_EIGHT });
	await page.goto(`/farms/${farmId}/fields/${fieldId}`);
	await page.getByTestId('field-seasons').getByRole('link', { name: '2027' }).click();
	await expect(page.getByRole('heading', { level: 1 })).toHaveText('Home 80 · 2027 plan');
	const summary = page.getByTestId('layout-summary');
	await expect(summary).toContainText(/\b63 lanes\b/);
	const planted = await page.getByTestId('planted-acres').textContent();

	// 8/8 → 12/12: the repeat goes from 40 ft to 60 ft, so fewer, wider lanes on the same acres.
	await page.getByLabel('Start from a preset').selectOption({ label: '12-row corn / 12-row soybean, 30-in rows' });
	await page.getByRole('button', { name: 'Use preset' }).click();
	await expect(summary).toContainText(/\b42 lanes\b/);
	await expect(page.getByTestId('planted-acres')).toHaveText(planted!);

	// A bigger headland takes acres away, live.
	await page.getByLabel('Headland (ft)').fill('80');
	await expect(page.getByTestId('planted-acres')).not.toHaveText(planted!);
	const lessPlanted = parseFloat((await page.getByTestId('planted-acres').textContent())!);
	expect(lessPlanted).toBeLessThan(parseFloat(planted!));
	await expect(summary).toContainText(/\b40 lanes\b/);

	// A pattern lane without row spacing: the message sits beside the pattern and the last good preview stays.
	await page.getByRole('spinbutton', { name: 'Row spacing (in)' }).first().fill('');
	await page.getByRole('spinbutton', { name: 'Row spacing (in)' }).first().blur();
	await expect(page.getByTestId('pattern-error')).toContainText('Lane 1 of the pattern');
	await expect(summary).toContainText(/\b40 lanes\b/);
	await page.getByRole('spinbutton', { name: 'Row spacing (in)' }).first().fill('30');
	await page.getByRole('spinbutton', { name: 'Row spacing (in)' }).first().blur();
	await expect(page.getByTestId('pattern-error')).toHaveCount(0);

	await page.getByRole('button', { name: 'Save 2027 plan' }).click();
	await expect(page.getByRole('status').filter({ hasText: 'Saved: version 2' })).toBeVisible();

	// Plan 2028 one lane over and read the rotation matrix.
	await page.getByRole('button', { name: 'Plan 2028 from this' }).click();
	const next = page.getByTestId('next-season');
	await expect(next).toContainText('one lane: 30.00 ft');
	const matrix = next.getByTestId('rotation-matrix');
	await expect(matrix.getByRole('row', { name: /corn soybean/ })).toBeVisible();
	await expect(matrix.getByRole('row', { name: /soybean corn/ })).toBeVisible();
	await expect(matrix.getByRole('row', { name: /corn corn/ })).toHaveCount(0);
	await next.getByRole('link', { name: 'Open the 2028 plan' }).click();
	await expect(page.getByRole('heading', { level: 1 })).toHaveText('Home 80 · 2028 plan');

	// Scroll back to 2025: the layout as it was, on the boundary it was laid on.
	await page.getByTestId('season-timeline').getByRole('link', { name: '2025' }).click();
	await expect(page.getByRole('heading', { level: 1 })).toHaveText('Home 80 · 2025 plan');
	await expect(summary).toContainText(/\b63 lanes\b/);
	await expect(page.getByText('This plan was laid out on boundary version 2')).toHaveCount(0);
	expect([...hosts]).toEqual(['127.0.0.1']);
	await context.close();
});

test('a stale save gets 409 and offers to reload or compare', async ({ browser }) => {
	const a = await browser.newContext();
	const b = await browser.newContext();
	const pa = await a.newPage();
	const pb = await b.newPage();
	// One owner, signed in twice: the conflict is between two open copies of the plan.
	const own = await ownFarm(pa, 'conflict');
	const { boundary, guidance } = eightyAcres(-94.33, 43.72);
	const fieldId = await ownField(pa.request, own.farmId, 'Conflict field', boundary);
	await ownPlan(pa.request, own.farmId, fieldId, 2026, { guidance, ...EIGHT_EIGHT });
	await signIn(pb, own.email, own.password);
	const url = `/farms/${own.farmId}/fields/${fieldId}/plans/2026`;
	await pa.goto(url);
	await pb.goto(url);
	await pa.getByLabel('Headland (ft)').fill('35');
	await expect(pa.getByTestId('layout-summary')).not.toContainText('updating');
	await pa.getByRole('button', { name: 'Save 2026 plan' }).click();
	await expect(pa.getByRole('status').filter({ hasText: 'Saved' })).toBeVisible();

	await pb.getByLabel('Headland (ft)').fill('50');
	await pb.getByRole('button', { name: 'Save 2026 plan' }).click();
	const conflict = pb.getByTestId('conflict');
	await expect(conflict).toContainText('Someone else saved this plan after you opened it');
	await conflict.getByRole('button', { name: 'Compare' }).click();
	await expect(conflict.getByRole('row', { name: /Headland 35 ft 50 ft/ })).toBeVisible();
	await conflict.getByRole('button', { name: 'Reload their version' }).click();
	await expect(pb.getByLabel('Headland (ft)')).toHaveValue('35');
	await a.close();
	await b.close();
});

// About the demo scenario: its two past seasons of North 80, read as seeded (no test writes them).
test('compare the demo\'s two seasons side by side and overlaid', async ({ page }) => {
	await apiSignIn(page.request, 'advisor');
	await page.goto(`${NORTH80}/compare?a=2025&b=2026`);
	await expect(page.getByRole('heading', { level: 1 })).toHaveText('Compare 2025 and 2026 · North 80');
	await expect(page.getByRole('region', { name: 'Lanes in 2025' })).toBeVisible();
	await expect(page.getByRole('region', { name: 'Lanes in 2026' })).toBeVisible();
	const matrix = page.getByTestId('rotation-matrix');
	await expect(matrix).toContainText('corn');
	await expect(matrix.getByRole('row', { name: /corn corn/ })).toHaveCount(0);
	await page.getByRole('button', { name: 'Overlaid' }).click();
	await expect(page.getByRole('region', { name: '2026 over 2025' })).toBeVisible();
	// Advisors read plans but cannot edit them.
	await page.goto(`${NORTH80}/plans/2026`);
	await expect(page.getByRole('button', { name: /Save 2026 plan/ })).toHaveCount(0);
	await expect(page.getByTestId('lane-table')).toBeVisible();
});

test('adopt a variant without JavaScript, then adopt the main plan back', async ({ browser }) => {
	const setup = await (await browser.newContext()).newPage();
	const own = await ownFarm(setup, 'variants');
	const { boundary, guidance } = eightyAcres(-94.35, 43.73);
	const fieldId = await ownField(setup.request, own.farmId, 'Variant field', boundary);
	await ownPlan(setup.request, own.farmId, fieldId, 2027, { guidance, ...EIGHT_EIGHT });
	const twelve = { kind: 'crop', crop: 'corn', rows: 12, rowSpacingIn: 30 };
	await ownPlan(setup.request, own.farmId, fieldId, 2027, { guidance, ...EIGHT_EIGHT, pattern: [twelve, { ...twelve, crop: 'soybean' }], variant: '12/12 strips' });
	await setup.context().close();

	const context = await browser.newContext({ javaScriptEnabled: false });
	const page = await context.newPage();
	await signIn(page, own.email, own.password);
	const field = `/farms/${own.farmId}/fields/${fieldId}`;
	await page.goto(`${field}/plans/2027?variant=${encodeURIComponent('12/12 strips')}`);
	await expect(page.getByRole('heading', { level: 1 })).toHaveText('Variant field · 2027 plan · 12/12 strips');
	await page.getByRole('button', { name: 'Adopt 12/12 strips' }).click();
	await expect(page.getByRole('link', { name: '12/12 strips (adopted)' })).toBeVisible();
	const adopted = await (await page.request.get(`/api/farms/${own.farmId}/fields/${fieldId}/plans/2027`)).json();
	expect(adopted.variant).toBe('12/12 strips');
	expect(adopted.lanes).toHaveLength(42);

	await page.goto(`${field}/plans/2027?variant=main`);
	await page.getByRole('button', { name: 'Adopt main' }).click();
	await expect(page.getByRole('link', { name: 'main (adopted)' })).toBeVisible();
	await context.close();
});
