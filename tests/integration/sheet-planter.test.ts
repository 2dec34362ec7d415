import { describe, expect, it } from 'vitest';
import { randomUUID } from 'node:crypto';
import { createField } from '$lib/server/fields';
import { savePlan } from '$lib/server/plans';
import { createEquipment } from '$lib/server/equipment';
import { equipmentSchema } from '$lib/schemas/equipment';
import { loadSheet } from '$lib/server/sheet';
import { requireMember } from '$lib/server/access';
import { db } from '$lib/server/db';
import { fakeEvent, makeFarmWithTeam, thrown } from './helpers';
import { rectangle } from '../fixtures/rectangle';

describe('the planter a sheet is printed for', () => {
	it('is picked from one read of the farm’s implements: the one asked for, else the default; a drill or an unknown id is refused', async () => {
		const { farm, members } = await makeFarmWithTeam();
		const access = await requireMember(fakeEvent(members.owner), farm.id, 'editPlans');
		const boundary = rectangle(200, 600);
		const field = await createField(access, { name: 'Sheet planter', boundary, exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
		const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
		await savePlan(access, field.id, 2027, {
			guidance: { a: sw, b: nw }, pattern: [{ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 }, { kind: 'crop', crop: 'soybean', rows: 8, rowSpacingIn: 30 }],
			offsetFt: 0, headlandFt: 0, variant: 'main', assignments: [], notes: null, rebase: false, version: 0
		});
		const units = (n: number) => Array.from({ length: n }, (_, i) => ({ unit: i + 1, seed: { crop: 'corn', variety: null }, fertilizerOn: [] }));
		const big = await createEquipment(access, equipmentSchema.parse({ name: 'Eight-row', kind: 'planter', isDefaultPlanter: true, planter: { rowSpacingIn: 30, rowUnits: units(8), fertilizerLines: [] } }));
		const small = await createEquipment(access, equipmentSchema.parse({ name: 'Four-row', kind: 'planter', planter: { rowSpacingIn: 30, rowUnits: units(4), fertilizerLines: [] } }));
		const drill = await createEquipment(access, equipmentSchema.parse({ name: 'Grain drill', kind: 'drill', workingWidthFt: 15 }));

		const sql: string[] = [];
		const onQuery = (q: { sql: string }) => sql.push(q.sql);
		db().on('query', onQuery);
		const byDefault = await loadSheet(access, field.id, 2027);
		db().removeListener('query', onQuery);
		expect(byDefault.equipment?.name).toBe(big.name);
		expect(sql.filter((q) => /from "equipment"/.test(q))).toHaveLength(1);

		expect((await loadSheet(access, field.id, 2027, { planterId: small.id })).equipment?.name).toBe('Four-row');
		const notPlanter = (await thrown(() => loadSheet(access, field.id, 2027, { planterId: drill.id }))) as unknown as { status: number; message: string };
		expect(notPlanter.status).toBe(400);
		expect(notPlanter.message).toBe('Grain drill is not a planter.');
		const unknown = (await thrown(() => loadSheet(access, field.id, 2027, { planterId: randomUUID() }))) as unknown as { status: number };
		expect(unknown.status).toBe(404);
	});
});
