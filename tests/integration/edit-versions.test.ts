import { describe, expect, it } from 'vitest';
import type { Polygon } from 'geojson';
import { createField, getField, listBoundaryVersions, updateField } from '$lib/server/fields';
import { createEquipment, getEquipment, updateEquipment } from '$lib/server/equipment';
import { requireMember } from '$lib/server/access';
import { equipmentSchema } from '$lib/schemas/equipment';
import type { SessionUser } from '$lib/server/auth';
import { PATCH as patchField } from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/+server';
import { actions as fieldEdit } from '../../src/routes/(app)/farms/[farmId]/fields/[fieldId]/edit/+page.server';
import { actions as equipmentEdit } from '../../src/routes/(app)/farms/[farmId]/equipment/[equipmentId]/+page.server';
import { fakeEvent, makeFarmWithTeam, thrown } from './helpers';
import { rectangle } from '../fixtures/rectangle';

async function setup() {
	const { farm, members } = await makeFarmWithTeam();
	const access = await requireMember(fakeEvent(members.owner), farm.id, 'editPlans');
	const field = await createField(access, { name: 'Versioned', boundary: rectangle(400, 800), exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
	return { farm, members, access, field };
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function jsonEvent(user: SessionUser, path: string, params: Record<string, string>, body: unknown): any {
	const url = new URL(`http://127.0.0.1${path}`);
	return { locals: { user, session: null }, url, params, request: new Request(url, { method: 'PATCH', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) }) };
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function formEvent(user: SessionUser, path: string, params: Record<string, string>, form: Record<string, string>): any {
	const url = new URL(`http://127.0.0.1${path}`);
	const body = new FormData();
	for (const [k, v] of Object.entries(form)) body.set(k, v);
	return { locals: { user, session: null }, url, params, request: new Request(url, { method: 'POST', body }) };
}

describe('field edits carry the version they were made on', () => {
	it('API PATCH: a stale version answers 409 version_conflict and changes nothing; no version is a 400 on "version"', async () => {
		const { farm, members, field } = await setup();
		const path = `/api/farms/${farm.id}/fields/${field.id}`;
		const params = { farmId: farm.id, fieldId: field.id };

		const first = await patchField(jsonEvent(members.manager, path, params, { name: 'Renamed', version: 1 }));
		expect(first.status).toBe(200);
		expect(await first.json()).toMatchObject({ name: 'Renamed', version: 2 });

		const stale = await patchField(jsonEvent(members.manager, path, params, { name: 'Late', boundary: rectangle(500, 800), version: 1 }));
		expect(stale.status).toBe(409);
		const body = await stale.json();
		expect(body.error.code).toBe('version_conflict');
		expect(body.error.message).toBe('Someone else saved this field after you opened it (version 2, yours 1). Reload to see their changes; nothing of yours was saved.');

		const missing = await patchField(jsonEvent(members.manager, path, params, { name: 'No version' }));
		expect(missing.status).toBe(400);
		const refused = await missing.json();
		expect(refused.error.code).toBe('invalid');
		expect(refused.error.fields.version).toEqual(['Send the version of the field you edited (a whole number), so a newer save is not overwritten.']);

		// Another farm's field answers 404 before its body is looked at.
		const other = await setup();
		const foreign = await patchField(jsonEvent(members.manager, `/api/farms/${farm.id}/fields/${other.field.id}`, { farmId: farm.id, fieldId: other.field.id }, { name: 'Taken' }));
		expect(foreign.status).toBe(404);
		expect((await foreign.json()).error.code).toBe('not_found');

		const access = await requireMember(fakeEvent(members.owner), farm.id, 'read');
		const stored = await getField(access, field.id);
		expect(stored).toMatchObject({ name: 'Renamed', version: 2, boundaryVersion: 1, acres: field.acres });
		expect((await listBoundaryVersions(access, field.id)).map((v) => v.version)).toEqual([1]);
	});

	it('edit form: a stale hidden version fails with 409 and a conflict message; a form without it is refused', async () => {
		const { farm, members, access, field } = await setup();
		await updateField(access, field.id, { notes: 'someone else was here', version: 1 });
		const path = `/farms/${farm.id}/fields/${field.id}/edit`;
		const params = { farmId: farm.id, fieldId: field.id };
		const wider: Polygon = rectangle(600, 800);
		const form = { name: 'Mine', farmNumber: '', tractNumber: '', fieldNumber: '', landlord: '', notes: '', reason: 'fence', shape: JSON.stringify({ boundary: wider, exclusions: [] }) };

		const stale = (await fieldEdit.default(formEvent(members.manager, path, params, { ...form, version: '1' }))) as { status: number; data: { conflict?: string; values: { name: string } } };
		expect(stale.status).toBe(409);
		expect(stale.data.conflict).toBe('Someone else saved this field after you opened it (version 2, yours 1). Reload to see their changes; nothing of yours was saved.');
		expect(stale.data.values.name).toBe('Mine'); // what was typed stays in the form

		const noVersion = (await fieldEdit.default(formEvent(members.manager, path, params, form))) as { status: number; data: { errors: Record<string, string[]> } };
		expect(noVersion.status).toBe(400);
		expect(noVersion.data.errors.version).toEqual(['The form lost the version of the field it edits. Reload the page and make the change again.']);

		expect(await getField(access, field.id)).toMatchObject({ name: 'Versioned', notes: 'someone else was here', version: 2, boundaryVersion: 1 });

		const saved = await thrown(() => fieldEdit.default(formEvent(members.manager, path, params, { ...form, version: '2' })));
		expect(saved.status).toBe(303);
		expect(await getField(access, field.id)).toMatchObject({ name: 'Mine', version: 3, boundaryVersion: 2 });
	});
});

describe('equipment edits carry the version they were made on', () => {
	it('an update without a version is refused on "version" and changes nothing (module and form)', async () => {
		const { farm, members, access } = await setup();
		const drill = await createEquipment(access, equipmentSchema.parse({ name: 'Drill', kind: 'drill', workingWidthFt: 15 }));
		const e = (await thrown(() => updateEquipment(access, drill.id, equipmentSchema.parse({ name: 'Drill', kind: 'drill', workingWidthFt: 40 })))) as unknown as { status: number; fields: Record<string, string[]> };
		expect(e.status).toBe(400);
		expect(e.fields.version).toEqual(['Send the version of the implement you edited, so a newer save is not overwritten.']);

		const path = `/farms/${farm.id}/equipment/${drill.id}`;
		const res = (await equipmentEdit.save(formEvent(members.manager, path, { farmId: farm.id, equipmentId: drill.id }, { name: 'Drill', kind: 'drill', workingWidthFt: '40' }))) as { status: number; data: { errors: Record<string, string[]>; conflict: boolean } };
		expect(res.status).toBe(400);
		expect(res.data.errors.version).toEqual(['Send the version of the implement you edited, so a newer save is not overwritten.']);
		expect(res.data.conflict).toBe(false);
		expect(await getEquipment(access, drill.id)).toMatchObject({ workingWidthFt: 15, version: 1 });
	});
});
