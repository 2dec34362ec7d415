import { describe, expect, it } from 'vitest';
import geodesic from 'geographiclib-geodesic';
import type { Polygon } from 'geojson';
import { createField, deleteField, getField, listBoundaryVersions, listFields, updateField } from '$lib/server/fields';
import { requireMember } from '$lib/server/access';
import { setFieldScope } from '$lib/server/team';
import { fakeEvent, makeFarmWithTeam, thrown } from './helpers';

const { Geodesic } = geodesic as unknown as { Geodesic: { WGS84: { Direct: (lat: number, lon: number, azi: number, s: number) => { lat2: number; lon2: number }; Polygon: (polyline: boolean) => { AddPoint: (lat: number, lon: number) => void; Compute: (reverse: boolean, sign: boolean) => { area: number } } } } };
const WGS84 = Geodesic.WGS84;
const FT = 0.3048; // international foot, NIST

/** A square of side `ft` built with geodesic Direct (GeographicLib), south-west corner at lat/lng. */
function square(lat: number, lng: number, ft: number): Polygon {
	const s = ft * FT;
	const se = WGS84.Direct(lat, lng, 90, s);
	const ne = WGS84.Direct(se.lat2, se.lon2, 0, s);
	const nw = WGS84.Direct(lat, lng, 0, s);
	return { type: 'Polygon', coordinates: [[[lng, lat], [se.lon2, se.lat2], [ne.lon2, ne.lat2], [nw.lon2, nw.lat2], [lng, lat]]] };
}

function geographicLibAcres(p: Polygon): number {
	const poly = WGS84.Polygon(false);
	for (const [lng, lat] of p.coordinates[0].slice(0, -1)) poly.AddPoint(lat, lng);
	return Math.abs(poly.Compute(false, true).area) / 4046.8564224; // acre = 4,046.8564224 m² exactly
}

async function ownerAccess() {
	const { farm, members } = await makeFarmWithTeam();
	return { access: await requireMember(fakeEvent(members.owner), farm.id, 'editPlans'), farm, members };
}

describe('fields', () => {
	it('measures a new field on the ellipsoid and keeps its first boundary version', async () => {
		const { access } = await ownerAccess();
		// A quarter-quarter section is 40 acres nominal: 1,320 ft square (43 U.S.C. §751).
		const boundary = square(42, -93.6, 1320);
		const field = await createField(access, { name: 'South forty', boundary, exclusions: [], farmNumber: '12', tractNumber: '34', fieldNumber: '5', landlord: null, notes: null });
		// Arithmetic: a 1,320 ft square holds 40 ac of 43,560 sq ft. This one closes its
		// north side between two meridian walks, so it is square only to ~0.003 %.
		expect(field.acres).toBeCloseTo(40.0, 2);
		expect(Math.abs(field.acres - geographicLibAcres(boundary)) / geographicLibAcres(boundary)).toBeLessThan(1e-4);
		expect(field.boundaryVersion).toBe(1);
		const versions = await listBoundaryVersions(access, field.id);
		expect(versions.map((v) => [v.version, +v.acres.toFixed(2)])).toEqual([[1, 40]]);
	});

	it('subtracts exclusions and refuses exclusions that cover the field', async () => {
		const { access } = await ownerAccess();
		const boundary = square(43.9, -94.2, 1320);
		const waterway = square(43.901, -94.199, 200);
		const field = await createField(access, { name: 'With waterway', boundary, exclusions: [{ name: 'waterway', kind: 'waterway', geometry: waterway }], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
		expect(field.excludedAcres).toBeCloseTo(geographicLibAcres(waterway), 3);
		const e = await thrown(() => createField(access, { name: 'All gone', boundary, exclusions: [{ name: 'all', kind: 'other', geometry: square(43.8999, -94.2001, 1400) }], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null }));
		expect(e.status).toBe(400);
		expect((e as unknown as { fields: Record<string, string[]> }).fields.exclusions[0]).toBe('The exclusions cover the whole field: nothing is left to plant.');
	});

	it('refuses a self-crossing outline saying where, a 0-acre one and one over 20,000 acres', async () => {
		const { access } = await ownerAccess();
		const base = { exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null };
		const bowtie: Polygon = { type: 'Polygon', coordinates: [[[-94.2, 43.9], [-94.19, 43.91], [-94.19, 43.9], [-94.2, 43.91], [-94.2, 43.9]]] };
		const e1 = (await thrown(() => createField(access, { ...base, name: 'bow', boundary: bowtie }))) as unknown as { status: number; message: string };
		expect(e1.status).toBe(400);
		expect(e1.message).toMatch(/^The field boundary crosses itself near longitude -94\.195000, latitude 43\.90500\d/);
		// Points along one meridian: the geodesics are the meridian itself, so the area is exactly 0.
		const flat: Polygon = { type: 'Polygon', coordinates: [[[-94.2, 43.9], [-94.2, 43.91], [-94.2, 43.92], [-94.2, 43.9]]] };
		expect(((await thrown(() => createField(access, { ...base, name: 'flat', boundary: flat }))) as unknown as { message: string }).message).toBe('The field boundary encloses no area (0 acres): its corners lie on one line.');
		const huge = square(43, -95, 30_000); // ≈ 20,661 ac
		expect(((await thrown(() => createField(access, { ...base, name: 'huge', boundary: huge }))) as unknown as { message: string }).message).toMatch(/more than the 20,000-acre limit/);
		expect(await listFields(access)).toEqual([]);
	});

	it('keeps the old outline when the boundary is edited, and checks the version', async () => {
		const { access } = await ownerAccess();
		const field = await createField(access, { name: 'Moving fence', boundary: square(44, -94, 1000), exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
		const renamed = await updateField(access, field.id, { name: 'Moved fence', version: field.version });
		expect(renamed.boundaryVersion).toBe(1); // details only: no new outline
		const edited = await updateField(access, field.id, { boundary: square(44, -94, 1100), reason: 'fence moved', version: renamed.version });
		expect(edited.boundaryVersion).toBe(2);
		expect(edited.acres).toBeGreaterThan(field.acres);
		const versions = await listBoundaryVersions(access, field.id);
		expect(versions.map((v) => [v.version, v.reason])).toEqual([[2, 'fence moved'], [1, 'first outline']]);
		expect(versions[1].acres).toBeCloseTo(field.acres, 6);
		const stale = await thrown(() => updateField(access, field.id, { name: 'Late', version: field.version }));
		expect(stale.status).toBe(409);
		expect((await getField(access, field.id)).name).toBe('Moved fence');
	});

	it('refuses a second field with the same name on the farm', async () => {
		const { access } = await ownerAccess();
		const base = { exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null };
		await createField(access, { ...base, name: 'Home', boundary: square(44, -94, 500) });
		const e = (await thrown(() => createField(access, { ...base, name: 'home', boundary: square(44.01, -94, 500) }))) as unknown as { status: number; message: string };
		expect(e.status).toBe(400);
		expect(e.message).toBe('This farm already has a field named home.');
	});

	it('shows viewers only the fields granted to them, and another farm nothing', async () => {
		const { access, farm, members } = await ownerAccess();
		const base = { exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null };
		const a = await createField(access, { ...base, name: 'Granted', boundary: square(44, -94, 500) });
		const b = await createField(access, { ...base, name: 'Private', boundary: square(44.01, -94, 500) });
		await setFieldScope(farm.id, members.owner.id, members.viewer.id, [a.id]);
		const viewer = await requireMember(fakeEvent(members.viewer), farm.id, 'read');
		expect((await listFields(viewer)).map((f) => f.name)).toEqual(['Granted']);
		expect((await thrown(() => getField(viewer, b.id))).status).toBe(404);
		const crew = await requireMember(fakeEvent(members.crew), farm.id, 'read');
		expect((await listFields(crew)).map((f) => f.name)).toEqual(['Granted', 'Private']);
		const other = await ownerAccess();
		expect((await thrown(() => getField(other.access, a.id))).status).toBe(404);
	});

	it('soft-deletes: gone from the list, history kept', async () => {
		const { access } = await ownerAccess();
		const field = await createField(access, { name: 'Gone', boundary: square(44, -94, 500), exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
		await deleteField(access, field.id);
		expect(await listFields(access)).toEqual([]);
		expect((await thrown(() => getField(access, field.id))).status).toBe(404);
	});
});
