// Saving a field (draw, paste or API) refuses outlines the server cannot work with, in plain words,
// with the check run in the geometry worker pool.
import type { Polygon, Position } from 'geojson';
import { afterAll, describe, expect, it } from 'vitest';
import { createField, listFields } from '$lib/server/fields';
import { requireMember } from '$lib/server/access';
import { AppError } from '$lib/server/errors';
import { closeGeometryPool } from '$lib/server/geometry-pool';
import { fakeEvent, makeFarmWithTeam } from './helpers';

afterAll(closeGeometryPool);

async function ownerAccess() {
	const { farm, members } = await makeFarmWithTeam();
	return requireMember(fakeEvent(members.owner), farm.id, 'editPlans');
}

const details = { farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null };

async function refusal(promise: Promise<unknown>): Promise<AppError> {
	const e = await promise.then(() => 'saved', (x: unknown) => x);
	expect(e).toBeInstanceOf(AppError);
	return e as AppError;
}

describe('field outline limits', () => {
	it('refuses a boundary across the 180th meridian with 400 on boundary, and stores nothing', async () => {
		const access = await ownerAccess();
		const boundary: Polygon = { type: 'Polygon', coordinates: [[[179.998, -17.01], [-179.998, -17.01], [-179.998, -17], [179.998, -17], [179.998, -17.01]]] };
		const e = await refusal(createField(access, { name: 'Across', boundary, exclusions: [], ...details }));
		expect(e.status).toBe(400);
		const message = 'The field boundary crosses the 180th meridian (the date line) near latitude -17.0100; a field must lie on one side of it. Split it there into two fields.';
		expect(e.message).toBe(message);
		expect(e.fields).toEqual({ boundary: [message] });
		expect(await listFields(access)).toEqual([]);
	}, 60_000);

	it('refuses a boundary around the South Pole', async () => {
		const access = await ownerAccess();
		const ring: Position[] = [];
		for (let lng = -180; lng < 180; lng += 60) ring.push([lng, -89.9]);
		ring.push(ring[0]);
		const e = await refusal(createField(access, { name: 'Cap', boundary: { type: 'Polygon', coordinates: [ring] }, exclusions: [], ...details }));
		expect(e.status).toBe(400);
		expect(e.fields).toEqual({ boundary: ['The field boundary goes all the way around the South Pole; a field outline must not enclose a pole.'] });
	}, 60_000);

	it('refuses more than 50,000 corners, boundary and exclusions together', async () => {
		const access = await ownerAccess();
		const ring: Position[] = [];
		for (let i = 0; i < 50_000; i++) ring.push([-93.9 + 0.004 * Math.cos((2 * Math.PI * i) / 50_000), 44.1 + 0.003 * Math.sin((2 * Math.PI * i) / 50_000)]);
		ring.push(ring[0]);
		const e = await refusal(createField(access, { name: 'Traced', boundary: { type: 'Polygon', coordinates: [ring] }, exclusions: [], ...details }));
		expect(e.status).toBe(400);
		const message = 'The field boundary has 50,001 points; a field may have at most 50,000. Simplify the outline (most GIS programs can thin points to a tolerance of about 0.1 m) and try again.';
		expect(e.message).toBe(message);
		expect(e.fields).toEqual({ boundary: [message] });
	}, 60_000);
});
