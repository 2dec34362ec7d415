// Data a test makes for itself: a new owner with a farm of their own, fields and plans through
// the JSON API. Tests that write use these, so the demo stays as seeded for tests about the demo.
import { expect, type APIRequestContext, type Browser, type Page } from '@playwright/test';
import { randomUUID } from 'node:crypto';
import type { Polygon } from 'geojson';
import { finishSignUp, firstLink, signUp, uniqueEmail, waitForMail } from './helpers';
import { rectangle } from '../fixtures/rectangle';

export const OWN_PASSWORD = 'a good long password';

export interface OwnFarm {
	farmId: string;
	farmName: string;
	email: string;
	password: string;
}

/** Signs up a new owner in `page` (whose `request` then carries the session) and creates their farm. */
export async function ownFarm(page: Page, tag = 'owner'): Promise<OwnFarm> {
	const email = uniqueEmail(tag);
	const farmName = `Test farm ${randomUUID().slice(0, 6)}`;
	await signUp(page, `Test ${tag}`, email, OWN_PASSWORD);
	await page.getByLabel('Farm name').fill(farmName);
	await page.getByRole('button', { name: 'Create farm' }).click();
	await expect(page.getByRole('heading', { level: 1, name: farmName })).toBeVisible();
	return { farmId: new URL(page.url()).pathname.split('/')[2], farmName, email, password: OWN_PASSWORD };
}

/** Creates a field through the API; answers its id. */
export async function ownField(request: APIRequestContext, farmId: string, name: string, boundary: Polygon): Promise<string> {
	const res = await request.post(`/api/farms/${farmId}/fields`, { data: { name, boundary } });
	expect(res.status(), await res.text()).toBe(201);
	return (await res.json()).id;
}

export const CORN_8 = { kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 };
export const SOYBEAN_8 = { kind: 'crop', crop: 'soybean', rows: 8, rowSpacingIn: 30 };
export const PASTURE_10 = { kind: 'pasture', crop: 'pasture', widthFt: 10 };

/** A 1,320 × 2,640 ft field (80 ac) with its A-B line up the west edge. */
export function eightyAcres(lng = -94.31, lat = 43.71) {
	const boundary = rectangle(1320, 2640, lng, lat);
	const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
	return { boundary, guidance: { a: sw, b: nw } };
}

/** Saves a new plan (version 0) through the API; answers the saved plan. */
export async function ownPlan(
	request: APIRequestContext,
	farmId: string,
	fieldId: string,
	season: number,
	plan: { guidance: { a: [number, number]; b: [number, number] }; pattern: object[]; offsetFt: number; headlandFt: number; variant?: string }
) {
	const res = await request.put(`/api/farms/${farmId}/fields/${fieldId}/plans/${season}`, { data: { ...plan, version: 0 } });
	expect(res.status(), await res.text()).toBe(200);
	return res.json();
}

/** The owner (signed in on `owner`) invites a new member with `role`, who signs up in a browser of their own and joins. */
export async function joinOwnFarm(browser: Browser, owner: Page, farm: OwnFarm, role: 'manager' | 'crew' | 'advisor' | 'viewer'): Promise<{ page: Page; email: string }> {
	const email = uniqueEmail(`member-${role}`);
	await owner.goto(`/farms/${farm.farmId}/team`);
	await owner.getByLabel('E-mail').fill(email);
	await owner.getByLabel('Role', { exact: true }).selectOption(role);
	await owner.getByRole('button', { name: 'Send invitation' }).click();
	await expect(owner.getByText(`Invitation sent to ${email}`)).toBeVisible();
	const mail = await waitForMail(owner.request, email, new RegExp(`invites you to ${farm.farmName}`));
	const page = await (await browser.newContext()).newPage();
	await page.goto(firstLink(mail.text));
	await page.getByRole('link', { name: 'Create an account' }).click();
	await page.getByLabel('Your name').fill(`Test ${role}`);
	await page.getByLabel('E-mail').fill(email);
	await page.getByLabel('Password').fill(OWN_PASSWORD);
	await page.getByRole('button', { name: 'Create account' }).click();
	await finishSignUp(page, email);
	await page.getByRole('button', { name: new RegExp(`Join ${farm.farmName}`) }).click();
	await expect(page.getByRole('heading', { level: 1, name: farm.farmName })).toBeVisible();
	return { page, email };
}
