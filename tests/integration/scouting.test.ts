import { describe, expect, it } from 'vitest';
import { centroid } from '@turf/turf';
import { db } from '$lib/server/db';
import { savePlan } from '$lib/server/plans';
import * as notesRoute from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/seasons/[season]/scouting/+server';
import * as noteRoute from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/seasons/[season]/scouting/[noteId]/+server';
import * as restoreRoute from '../../src/routes/api/farms/[farmId]/fields/[fieldId]/seasons/[season]/scouting/[noteId]/restore/+server';
import { makeUser } from './helpers';
import { call, farmWithPlan, photoForm, photoWithGps } from './scouting-setup';

const when = '2026-06-10T09:30:00-05:00';

describe('scouting notes API', () => {
	it('an advisor records a note on a lane at a distance along it, with a stand count worked out from the lane\'s row spacing', async () => {
		const s = await farmWithPlan();
		const params = { farmId: s.farm.id, fieldId: s.field.id, season: '2026' };
		expect(s.plan.lanes[0].crop).toBe('corn');
		const res = await call(notesRoute.POST, s.members.advisor, params, {
			method: 'POST',
			json: { laneIndex: 0, positionFt: 300, observedAt: when, growthStage: 'V6', pests: 'Armyworm feeding on 3 of 20 plants', weeds: 'Waterhemp escapes at the end', standCount: { plantsCounted: 32 } }
		});
		expect(res.status).toBe(201);
		expect(res.body.laneIndex).toBe(0);
		expect(res.body.lane).toEqual({ kind: 'crop', crop: 'corn', variety: null });
		expect(res.body.positionFt).toBe(300);
		expect(res.body.observedAt).toBe('2026-06-10T14:30:00.000Z');
		expect(res.body.growthStage).toBe('V6');
		// 8 rows in a 20-ft lane → 30-in rows; 1/1,000 acre of 30-in row is 17.424 ft (extension stand-count tables): 32 plants → 32,000/ac.
		expect(res.body.standCount).toEqual({ plantsCounted: 32, rowFeetCounted: 17.424, rowSpacingIn: 30, plantsPerAcre: 32000 });
		expect(res.body.author).toEqual({ id: s.members.advisor.id, name: s.members.advisor.name });
		expect(res.body.version).toBe(1);
		expect(res.body.photos).toEqual([]);

		await db()('memberships').where({ farm_id: s.farm.id, user_id: s.members.viewer.id }).update({ field_scope: [s.field.id] });
		const list = await call(notesRoute.GET, s.members.viewer, params);
		expect(list.status).toBe(200);
		expect(list.body.notes.map((n: { id: string }) => n.id)).toEqual([res.body.id]);
	});

	it('finds the lane from a map point, and refuses a point on no lane, an unknown lane and a position past the lane\'s end', async () => {
		const s = await farmWithPlan();
		const params = { farmId: s.farm.id, fieldId: s.field.id, season: '2026' };
		const [lng, lat] = centroid(s.plan.lanes[5].geometry).geometry.coordinates;
		const found = await call(notesRoute.POST, s.members.crew, params, { method: 'POST', json: { location: { lng, lat }, observedAt: when, notes: 'Hail damage on the leaves' } });
		expect(found.status).toBe(201);
		expect(found.body.laneIndex).toBe(5);
		expect(found.body.lane.crop).toBe(s.plan.lanes[5].crop);
		expect(found.body.location).toEqual({ lng, lat });
		expect(found.body.positionFt).toBeGreaterThan(640);
		expect(found.body.positionFt).toBeLessThan(680);

		const off = await call(notesRoute.POST, s.members.crew, params, { method: 'POST', json: { location: { lng: lng + 0.05, lat }, observedAt: when } });
		expect(off.status).toBe(400);
		expect(off.body.error.fields).toEqual({ location: ["That point is not on a lane of the season's plan; pick a point inside a lane."] });

		const wrongLane = await call(notesRoute.POST, s.members.crew, params, { method: 'POST', json: { laneIndex: 4, location: { lng, lat }, observedAt: when } });
		expect(wrongLane.status).toBe(400);
		expect(wrongLane.body.error.fields).toEqual({ location: ['That point is not inside lane 5.'] });

		const unknown = await call(notesRoute.POST, s.members.crew, params, { method: 'POST', json: { laneIndex: 99, observedAt: when } });
		expect(unknown.status).toBe(400);
		expect(unknown.body.error.fields).toEqual({ laneIndex: [`Lane 100 is not in the season's plan (lanes 1–${s.plan.lanes.length}).`] });

		const past = await call(notesRoute.POST, s.members.crew, params, { method: 'POST', json: { laneIndex: 2, positionFt: 5000, observedAt: when } });
		expect(past.status).toBe(400);
		expect(past.body.error.fields.positionFt[0]).toMatch(/^The lane is 1,3[12]\d ft long; give a position from 0 to 1,3[12]\d ft\.$/);
	});

	it('refuses bad input with field errors and writes nothing', async () => {
		const s = await farmWithPlan();
		const params = { farmId: s.farm.id, fieldId: s.field.id, season: '2026' };
		const cases: [unknown, string][] = [
			[{ laneIndex: 1, observedAt: '2099-06-10T09:30:00-05:00' }, 'observedAt'],
			[{ laneIndex: 1, observedAt: '2024-06-10T09:30:00-05:00' }, 'observedAt'],
			[{ laneIndex: 1, observedAt: '10 June' }, 'observedAt'],
			[{ laneIndex: 1, observedAt: when, standCount: { plantsCounted: -3 } }, 'standCount.plantsCounted'],
			[{ laneIndex: 1, observedAt: when, standCount: { plantsCounted: 30, rowFeetCounted: 0 } }, 'standCount.rowFeetCounted'],
			[{ observedAt: when }, 'laneIndex'],
			[{ laneIndex: -1, observedAt: when }, 'laneIndex']
		];
		for (const [json, field] of cases) {
			const res = await call(notesRoute.POST, s.members.owner, params, { method: 'POST', json });
			expect(res.status, JSON.stringify(json)).toBe(400);
			expect(Object.keys(res.body.error.fields)).toEqual([field]);
		}
		const future = await call(notesRoute.POST, s.members.owner, params, { method: 'POST', json: cases[0][0] });
		expect(future.body.error.fields.observedAt).toEqual(['A scouting note records what was seen: its time cannot be in the future.']);
		expect(await db()('scouting_notes').where({ farm_id: s.farm.id }).count('* as n').first()).toEqual({ n: 0 });

		const noPlan = await call(notesRoute.POST, s.members.owner, { ...params, season: '2025' }, { method: 'POST', json: { laneIndex: 0, observedAt: '2025-06-10T09:30:00-05:00' } });
		expect(noPlan.status).toBe(400);
		expect(noPlan.body.error.message).toBe('The field has no adopted plan for 2025, so there are no lanes to put a note on.');
	});

	it('a multipart note with a photo that fails a check stores neither the note nor the photo', async () => {
		const s = await farmWithPlan();
		const params = { farmId: s.farm.id, fieldId: s.field.id, season: '2026' };
		const form = photoForm({ lane: '500', observedAt: when }, [{ name: 'leaf.jpg', bytes: await photoWithGps(800, 600) }]);
		const res = await call(notesRoute.POST, s.members.advisor, params, { method: 'POST', form });
		expect(res.status).toBe(400);
		expect(Object.keys(res.body.error.fields)).toEqual(['laneIndex']);
		expect(await db()('attachments').where({ farm_id: s.farm.id }).count('* as n').first()).toEqual({ n: 0 });

		const ok = await call(notesRoute.POST, s.members.advisor, params, {
			method: 'POST',
			form: photoForm({ lane: '3', positionFt: '120', observedAt: when, plantsCounted: '29', growthStage: 'V5' }, [{ name: 'leaf.jpg', bytes: await photoWithGps(800, 600) }])
		});
		expect(ok.status).toBe(201);
		expect(ok.body.laneIndex).toBe(2); // page lanes are 1-based
		expect(ok.body.standCount.plantsPerAcre).toBe(29000);
		expect(ok.body.photos).toHaveLength(1);
		expect(ok.body.photos[0]).toMatchObject({ contentType: 'image/jpeg', width: 800, height: 600, originalName: 'leaf.jpg' });
	});

	it('roles: viewers and strangers cannot add notes; a viewer sees only granted fields; another farm answers 404', async () => {
		const s = await farmWithPlan();
		const other = await farmWithPlan();
		const params = { farmId: s.farm.id, fieldId: s.field.id, season: '2026' };
		const json = { laneIndex: 1, observedAt: when, notes: 'Lodging after storm' };

		for (const role of ['owner', 'manager', 'crew', 'advisor'] as const) {
			expect((await call(notesRoute.POST, s.members[role], params, { method: 'POST', json })).status, role).toBe(201);
		}
		const viewer = await call(notesRoute.POST, s.members.viewer, params, { method: 'POST', json });
		expect(viewer.status).toBe(403);
		expect(viewer.body.error.code).toBe('forbidden');

		const stranger = await makeUser('stranger');
		expect((await call(notesRoute.GET, stranger, params)).status).toBe(404);
		expect((await call(notesRoute.POST, stranger, params, { method: 'POST', json })).status).toBe(404);
		// A member of another farm naming this field under their own farm: not found.
		expect((await call(notesRoute.GET, other.members.owner, { ...params, farmId: other.farm.id })).status).toBe(404);
		expect((await call(notesRoute.POST, other.members.advisor, { ...params, farmId: other.farm.id }, { method: 'POST', json })).status).toBe(404);
		expect((await call(notesRoute.GET, null, params)).status).toBe(401);

		await db()('memberships').where({ farm_id: s.farm.id, user_id: s.members.viewer.id }).update({ field_scope: [other.field.id] });
		const hidden = await call(notesRoute.GET, s.members.viewer, params);
		expect(hidden.status).toBe(404);
		await db()('memberships').where({ farm_id: s.farm.id, user_id: s.members.viewer.id }).update({ field_scope: [s.field.id] });
		const shown = await call(notesRoute.GET, s.members.viewer, params);
		expect(shown.status).toBe(200);
		expect(shown.body.notes).toHaveLength(4);
	});

	it('edits check the version and keep who/before/after; deletes are soft; advisors change only their own notes', async () => {
		const s = await farmWithPlan();
		const params = { farmId: s.farm.id, fieldId: s.field.id, season: '2026' };
		const created = await call(notesRoute.POST, s.members.crew, params, { method: 'POST', json: { laneIndex: 1, observedAt: when, growthStage: 'V4' } });
		const noteParams = { ...params, noteId: created.body.id };

		const byAdvisor = await call(noteRoute.PATCH, s.members.advisor, noteParams, { method: 'PATCH', json: { version: 1, growthStage: 'V5' } });
		expect(byAdvisor.status).toBe(403);

		const edited = await call(noteRoute.PATCH, s.members.crew, noteParams, { method: 'PATCH', json: { version: 1, growthStage: 'V5', standCount: { plantsCounted: 15, rowFeetCounted: 10 } } });
		expect(edited.status).toBe(200);
		expect(edited.body.version).toBe(2);
		expect(edited.body.growthStage).toBe('V5');
		// 10 ft of 30-in row is 25 sq ft: 15 × 43,560 ÷ 25 = 26,136 plants/ac.
		expect(edited.body.standCount).toEqual({ plantsCounted: 15, rowFeetCounted: 10, rowSpacingIn: 30, plantsPerAcre: 26136 });

		const stale = await call(noteRoute.PATCH, s.members.manager, noteParams, { method: 'PATCH', json: { version: 1, growthStage: 'V9' } });
		expect(stale.status).toBe(409);
		expect(stale.body.error.code).toBe('version_conflict');
		expect((await call(noteRoute.GET, s.members.advisor, noteParams)).body.growthStage).toBe('V5');

		const audit = await db()('audit_log').where({ entity: 'scouting_note', entity_id: created.body.id }).orderBy('id');
		expect(audit.map((a) => a.action)).toEqual(['create', 'update']);
		expect(audit[1].user_id).toBe(s.members.crew.id);
		expect(audit[1].before.growthStage).toBe('V4');
		expect(audit[1].after.growthStage).toBe('V5');

		expect((await call(noteRoute.DELETE, s.members.manager, noteParams, { method: 'DELETE' })).status).toBe(204);
		expect((await call(noteRoute.GET, s.members.owner, noteParams)).status).toBe(404);
		const kept = await db()('scouting_notes').where({ id: created.body.id }).first();
		expect(kept.deleted_by).toBe(s.members.manager.id);

		// Owners and managers list deleted notes and restore them; others may not.
		expect((await call(notesRoute.GET, s.members.crew, params, { query: 'deleted=1' })).status).toBe(403);
		const deleted = await call(notesRoute.GET, s.members.manager, params, { query: 'deleted=1' });
		expect(deleted.body.notes.map((n: { id: string }) => n.id)).toEqual([created.body.id]);
		expect(typeof deleted.body.notes[0].deletedAt).toBe('string');
		expect((await call(restoreRoute.POST, s.members.crew, noteParams, { method: 'POST' })).status).toBe(403);
		const restored = await call(restoreRoute.POST, s.members.owner, noteParams, { method: 'POST' });
		expect(restored.status).toBe(200);
		expect(restored.body.growthStage).toBe('V5');
		expect(restored.body.version).toBe(3);
		expect(restored.body.deletedAt).toBeUndefined();
		expect((await call(restoreRoute.POST, s.members.owner, noteParams, { method: 'POST' })).status).toBe(404);
		const actions = await db()('audit_log').where({ entity: 'scouting_note', entity_id: created.body.id }).orderBy('id').pluck('action');
		expect(actions).toEqual(['create', 'update', 'delete', 'restore']);
	});

	it('keeps the lane as it was when the plan is laid out again', async () => {
		const s = await farmWithPlan();
		const params = { farmId: s.farm.id, fieldId: s.field.id, season: '2026' };
		const created = await call(notesRoute.POST, s.members.advisor, params, { method: 'POST', json: { laneIndex: 0, positionFt: 50, observedAt: when } });
		expect(created.body.lane.crop).toBe('corn');
		const [sw, , , nw] = (s.field.boundary as unknown as { coordinates: [number, number][][] }).coordinates[0];
		const moved = await savePlan(s.access, s.field.id, 2026, {
			guidance: { a: sw, b: nw },
			pattern: [{ kind: 'crop', crop: 'soybean', rows: 8, rowSpacingIn: 30 }, { kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 }],
			offsetFt: 0, headlandFt: 0, variant: 'main', assignments: [], notes: null, rebase: false, version: s.plan.version
		});
		expect(moved.lanes[0].crop).toBe('soybean');
		const read = await call(noteRoute.GET, s.members.advisor, { ...params, noteId: created.body.id });
		expect(read.body.lane.crop).toBe('corn');
		expect(read.body.location).toEqual(created.body.location);
	});
});
