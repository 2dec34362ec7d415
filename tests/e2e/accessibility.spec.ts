// axe-core over every main page of the product, read as the demo owner: no serious or critical
// violation of WCAG 2.x A/AA rules.
import { expect, test } from '@playwright/test';
import AxeBuilder from '@axe-core/playwright';
import { DEMO_FARM_ID, apiSignIn } from './helpers';

const farm = `/farms/${DEMO_FARM_ID}`;
const north80 = '5a1e0000-0000-4000-8000-0000000001f1';
const pasture = '5a1e0000-0000-4000-8000-0000000001f3';
const season = `${farm}/fields/${north80}/seasons/2026`;
// Demo catalogue, livestock and tour ids (seeds/05, 08 and 10).
const product = '5a1e0000-0000-4000-8000-0000000c0001';
const variety = '5a1e0000-0000-4000-8000-0000000d0001';
const eweFlock = '5a1e0000-0000-4000-8000-0000000b0001';
const tour = '5a1e0000-0000-4000-8000-0000000007a1';
const shareLink = '/share/demo-summer-field-day-2027-strips-and-lanes';

/** Main pages, signed out and signed in. A page that does not exist fails the test (status below 400). */
const PUBLIC_PAGES = ['/', '/sign-in', '/sign-up', '/forgot-password', shareLink, `${shareLink}/print`];
const FARM_PAGES = [
	'/farms',
	'/account',
	farm,
	`${farm}/fields`,
	`${farm}/fields/${north80}`,
	`${farm}/fields/${north80}/plans/2026`,
	`${farm}/fields/${north80}/plans/2026/sheet`,
	`${farm}/fields/${north80}/compare`,
	`${farm}/fields/new`,
	`${farm}/fields/import`,
	`${farm}/equipment`,
	`${farm}/team`,
	`${farm}/settings`,
	`${farm}/fields/${pasture}/plans/2026`,
	`${farm}/fields/${north80}/edit`,
	`${farm}/equipment/new`,
	`${farm}/planning`,
	`${farm}/needs`,
	`${farm}/records`,
	season,
	`${season}/records/new`,
	`${season}/quick`,
	`${season}/scouting`,
	`${season}/harvest`,
	`${season}/harvest/import`,
	`${farm}/products`,
	`${farm}/products/new`,
	`${farm}/products/${product}`,
	`${farm}/seeds`,
	`${farm}/seeds/${variety}`,
	`${farm}/rainfall`,
	`${farm}/livestock`,
	`${farm}/livestock/${eweFlock}`,
	`${farm}/harvest`,
	`${farm}/reports`,
	`${farm}/reports/landlord/${north80}`,
	`${farm}/tours`,
	`${farm}/tours/new`,
	`${farm}/tours/${tour}`
];

async function seriousViolations(page: import('@playwright/test').Page) {
	// Map panes are drawn by Leaflet (hundreds of lane paths); each map has a table or form beside it,
	// which is checked. Excluding the panes keeps a page's check to seconds.
	const result = await new AxeBuilder({ page }).withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa']).exclude('.leaflet-pane').analyze();
	return result.violations
		.filter((v) => v.impact === 'serious' || v.impact === 'critical')
		.map((v) => ({ rule: v.id, impact: v.impact, where: v.nodes.slice(0, 3).map((n) => n.target.join(' ')) }));
}

for (const path of PUBLIC_PAGES) {
	test(`no serious accessibility problems: ${path}`, async ({ page }) => {
		const res = await page.goto(path);
		expect(res?.status()).toBeLessThan(400);
		expect(await seriousViolations(page)).toEqual([]);
	});
}

// Phone width: where cab and field use happens, and where layout problems show first.
test.describe('signed in, phone width', () => {
	test.use({ viewport: { width: 390, height: 844 } });
	test.setTimeout(60_000);

	test('no serious accessibility problems: a record page', async ({ page }) => {
		await apiSignIn(page.request, 'owner');
		const list = await page.request.get(`/api${season}/records`);
		expect(list.status()).toBe(200);
		const { records } = await list.json();
		expect(records.length).toBeGreaterThan(0);
		const res = await page.goto(`${season}/records/${records[0].id}`);
		expect(res?.status()).toBeLessThan(400);
		expect(await seriousViolations(page)).toEqual([]);
	});

	for (const path of FARM_PAGES) {
		test(`no serious accessibility problems: ${path}`, async ({ page }) => {
			await apiSignIn(page.request, 'owner');
			const res = await page.goto(path);
			expect(res?.status()).toBeLessThan(400);
			await page.waitForLoadState('networkidle');
			expect(await seriousViolations(page)).toEqual([]);
		});
	}
});
