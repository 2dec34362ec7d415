// Restrictions on a season's lanes, read from the spraying (and other) records as stored.
import type { Knex } from 'knex';
import { db } from './db';
import { canSeeField, isUuid, type FarmAccess } from './access';
import { laneRestrictionsAt, type LaneApplication, type LaneRestriction } from '../records/restrictions';

/** Every product line of the field's season records ended by `at`, per lane, with its recorded intervals. */
export async function laneApplications(q: Knex, farmId: string, fieldId: string, season: number, at: Date): Promise<LaneApplication[]> {
	const rows = await q('operations as o')
		.join('operation_lanes as ol', 'ol.operation_id', 'o.id')
		.join('operation_products as op', 'op.operation_id', 'o.id')
		.where({ 'o.farm_id': farmId, 'o.field_id': fieldId, 'o.season': season })
		.whereNull('o.deleted_at')
		.where('o.ended_at', '<=', at)
		.select('ol.lane_index', 'o.ended_at', 'op.rei_hours', 'op.phi_days', 'op.grazing_days');
	return rows.map((r) => ({
		laneIndex: r.lane_index,
		endedAt: new Date(r.ended_at),
		reiHours: r.rei_hours == null ? null : Number(r.rei_hours),
		phiDays: r.phi_days,
		grazingDays: r.grazing_days
	}));
}

/**
 * Every lane of the season's adopted plan with when re-entry, harvest and grazing are allowed
 * again, as in force at `at`. Null when the season has no adopted plan or the member may not see
 * the field.
 */
export async function seasonRestrictions(access: FarmAccess, fieldId: string, season: number, at: Date, q: Knex = db()): Promise<LaneRestriction[] | null> {
	if (!isUuid(fieldId) || !canSeeField(access, fieldId)) return null;
	const plan = await q('plans as p')
		.join('fields as f', 'f.id', 'p.field_id')
		.where({ 'p.farm_id': access.farm.id, 'p.field_id': fieldId, 'p.season': season, 'p.adopted': true })
		.whereNull('p.deleted_at')
		.whereNull('f.deleted_at')
		.first('p.id');
	if (!plan) return null;
	const lanes: number[] = (await q('plan_lanes').where({ plan_id: plan.id }).orderBy('lane_index').select('lane_index')).map((r) => r.lane_index);
	const applications = await laneApplications(q, access.farm.id, fieldId, season, at);
	return laneRestrictionsAt(lanes, applications, at, access.farm.timeZone);
}
