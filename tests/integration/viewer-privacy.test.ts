import { describe, expect, it } from 'vitest';
import { requireMember } from '$lib/server/access';
import { createEquipment, findPlanter, getEquipment, listEquipment } from '$lib/server/equipment';
import { getViewerPrivacy, setViewerPrivacy } from '$lib/server/farms';
import { listMembersFor } from '$lib/server/team';
import { equipmentSchema } from '$lib/schemas/equipment';
import { db } from '$lib/server/db';
import { createField } from '$lib/server/fields';
import { savePlan } from '$lib/server/plans';
import { loadSheet } from '$lib/server/sheet';
import { load as planPage } from '../../src/routes/(app)/farms/[farmId]/fields/[fieldId]/plans/[season]/+page.server';
import { rectangle } from '../fixtures/rectangle';
import { fakeEvent, makeFarmWithTeam, thrown } from './helpers';

async function farmWithDrill() {
	const { farm, members } = await makeFarmWithTeam();
	const owner = await requireMember(fakeEvent(members.owner), farm.id, 'editPlans');
	const drill = await createEquipment(owner, equipmentSchema.parse({ name: '15-ft drill', kind: 'drill', workingWidthFt: 15 }));
	const accessOf = (role: keyof typeof members) => requireMember(fakeEvent(members[role]), farm.id, 'read');
	return { farm, members, drill, accessOf };
}

describe("viewers and the farm's private details", () => {
	it('keeps both hidden on a new farm', async () => {
		const { farm } = await farmWithDrill();
		expect(await getViewerPrivacy(farm.id)).toEqual({ memberEmails: false, equipment: false });
	});

	it("gives a viewer no one else's e-mail and no equipment while the settings are off", async () => {
		const { members, drill, accessOf } = await farmWithDrill();
		const viewer = await accessOf('viewer');
		expect(viewer.sees).toEqual({ memberEmails: false, equipment: false });
		const seen = await listMembersFor(viewer);
		expect(seen).toHaveLength(5);
		// Their own address is theirs to see; everyone else's is withheld by the server, not the page.
		expect(seen.filter((m) => m.email !== null).map((m) => m.email)).toEqual([members.viewer.email]);
		expect(seen.map((m) => m.name).sort()).toEqual(Object.values(members).map((u) => u.name).sort());
		expect(await listEquipment(viewer)).toEqual([]);
		expect((await thrown(() => getEquipment(viewer, drill.id))).status).toBe(404);
		expect(await findPlanter(viewer)).toBeNull();
	});

	it('shows a viewer each thing once the owner turns it on, and only that thing', async () => {
		const { farm, members, drill, accessOf } = await farmWithDrill();
		await setViewerPrivacy(farm.id, members.owner.id, { memberEmails: true, equipment: false });
		let viewer = await accessOf('viewer');
		expect((await listMembersFor(viewer)).map((m) => m.email).sort()).toEqual(Object.values(members).map((u) => u.email).sort());
		expect(await listEquipment(viewer)).toEqual([]);

		await setViewerPrivacy(farm.id, members.owner.id, { memberEmails: false, equipment: true });
		viewer = await accessOf('viewer');
		expect((await listMembersFor(viewer)).filter((m) => m.email !== null)).toHaveLength(1);
		expect((await listEquipment(viewer)).map((e) => e.name)).toEqual(['15-ft drill']);
		expect((await getEquipment(viewer, drill.id)).id).toBe(drill.id);

		const audit = await db()('audit_log').where({ farm_id: farm.id, action: 'viewer_privacy' }).orderBy('id');
		expect(audit.map((a) => a.after)).toEqual([{ memberEmails: true, equipment: false }, { memberEmails: false, equipment: true }]);
	});

	it('leaves every other role seeing e-mails and equipment with the settings off', async () => {
		const { members, accessOf } = await farmWithDrill();
		for (const role of ['owner', 'manager', 'crew', 'advisor'] as const) {
			const access = await accessOf(role);
			expect(access.sees).toEqual({ memberEmails: true, equipment: true });
			expect((await listMembersFor(access)).map((m) => m.email).sort()).toEqual(Object.values(members).map((u) => u.email).sort());
			expect((await listEquipment(access)).map((e) => e.name)).toEqual(['15-ft drill']);
		}
	});
});

describe("the plan's equipment as a viewer sees it", () => {
	async function planWithPlanter() {
		const { farm, members, accessOf } = await farmWithDrill();
		const owner = await requireMember(fakeEvent(members.owner), farm.id, 'editPlans');
		await createEquipment(owner, equipmentSchema.parse({
			name: '8-row planter', kind: 'planter', isDefaultPlanter: true,
			planter: { rowSpacingIn: 30, fertilizerLines: [], rowUnits: Array.from({ length: 8 }, (_, i) => ({ unit: i + 1, seed: { crop: 'corn', variety: null }, fertilizerOn: [] })) }
		}));
		const boundary = rectangle(235, 800, -94.25, 43.95);
		const field = await createField(owner, { name: 'Rented field', boundary, exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
		const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
		await savePlan(owner, field.id, 2027, {
			guidance: { a: sw, b: nw }, pattern: [{ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 }],
			offsetFt: 0, headlandFt: 0, version: 0, variant: 'main', assignments: [], notes: null, rebase: false
		});
		await db()('memberships').where({ farm_id: farm.id, user_id: members.viewer.id }).update({ field_scope: [field.id] });
		return { farm, members, field, accessOf };
	}

	it('leaves the planter and implements off the sheet until the owner shows equipment', async () => {
		const { farm, members, field, accessOf } = await planWithPlanter();
		const manager = await loadSheet(await accessOf('manager'), field.id, 2027);
		expect(manager.equipment?.name).toBe('8-row planter');
		const hidden = await loadSheet(await accessOf('viewer'), field.id, 2027);
		expect(hidden.equipment).toBeNull();
		expect(JSON.stringify(hidden)).not.toContain('drill');
		await setViewerPrivacy(farm.id, members.owner.id, { memberEmails: false, equipment: true });
		expect((await loadSheet(await accessOf('viewer'), field.id, 2027)).equipment?.name).toBe('8-row planter');
	});

	it('gives the plan page no planter checks or implements for a viewer while equipment is hidden', async () => {
		const { farm, members, field } = await planWithPlanter();
		const pageFor = async (who: 'viewer' | 'crew') => {
			const event = { ...fakeEvent(members[who], `/farms/${farm.id}/fields/${field.id}/plans/2027`), params: { farmId: farm.id, fieldId: field.id, season: '2027' } };
			return (await planPage(event as never)) as { planterChecks: { planter: string | null } | null; equipment: { name: string }[] };
		};
		const viewer = await pageFor('viewer');
		expect(viewer.planterChecks).toBeNull();
		expect(viewer.equipment).toEqual([]);
		const crew = await pageFor('crew');
		expect(crew.planterChecks?.planter).toBe('8-row planter');
		expect(crew.equipment.map((e) => e.name)).toEqual(['15-ft drill']);
	});
});
