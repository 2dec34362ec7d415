// Reads what the crop acreage report needs: every visible field's adopted lanes for the season and
// the first planting record per crop, then hands them to the pure report builder.
import { db } from './db';
import type { FarmAccess } from './access';
import { buildAcreageReport, type AcreageField, type AcreageReport, type LaneKindName } from '../reports/acreage';

/**
 * The season's acreage report for the fields this member may see (viewers: the granted ones).
 * A season with no adopted plan gives no rows and a warning that says so.
 */
export async function acreageReport(access: FarmAccess, season: number): Promise<AcreageReport> {
	const fieldsQuery = db()('fields').where({ farm_id: access.farm.id }).whereNull('deleted_at');
	if (access.fieldScope !== null) fieldsQuery.whereIn('id', access.fieldScope);
	const fields = await fieldsQuery.orderByRaw('lower(name)').select('id', 'name', 'farm_number', 'tract_number', 'field_number', 'landlord');
	const ids = fields.map((f) => f.id as string);
	if (ids.length === 0) return withEmptyWarning(buildAcreageReport(season, [], access.farm.timeZone));

	const [lanes, plantings] = await Promise.all([
		db()('plans as p')
			.join('plan_lanes as l', 'l.plan_id', 'p.id')
			.where({ 'p.farm_id': access.farm.id, 'p.season': season, 'p.adopted': true })
			.whereNull('p.deleted_at')
			.whereIn('p.field_id', ids)
			.orderBy('l.lane_index')
			.select('p.field_id', 'l.kind', 'l.crop', 'l.width_ft', 'l.rows', 'l.acres'),
		db()('operations as o')
			.join('operation_lanes as ol', 'ol.operation_id', 'o.id')
			.where({ 'o.farm_id': access.farm.id, 'o.season': season, 'o.type': 'planting' })
			.whereNull('o.deleted_at')
			.whereIn('o.field_id', ids)
			.groupBy('o.field_id', knexLowerCrop())
			.select('o.field_id', db().raw('lower(ol.crop) as crop'), db().raw('min(o.started_at) as started_at'))
	]);

	const byField = new Map<string, AcreageField>();
	for (const f of fields) {
		byField.set(f.id, {
			fieldId: f.id,
			fieldName: f.name,
			farmNumber: f.farm_number,
			tractNumber: f.tract_number,
			fieldNumber: f.field_number,
			landlord: f.landlord,
			lanes: [],
			plantingStarts: {}
		});
	}
	for (const l of lanes) {
		byField.get(l.field_id)!.lanes.push({ kind: l.kind as LaneKindName, crop: l.crop, widthFt: Number(l.width_ft), rows: l.rows, acres: Number(l.acres) });
	}
	for (const p of plantings) byField.get(p.field_id)!.plantingStarts[p.crop] = new Date(p.started_at);
	const planned = [...byField.values()].filter((f) => f.lanes.length > 0);
	return withEmptyWarning(buildAcreageReport(season, planned, access.farm.timeZone));
}

function knexLowerCrop() {
	return db().raw('lower(ol.crop)');
}

function withEmptyWarning(report: AcreageReport): AcreageReport {
	if (report.rows.length === 0) {
		report.warnings.unshift(`No field has an adopted plan for ${report.season}, so there are no acres to report. Adopt a plan for each field first.`);
	}
	return report;
}
