// Harvest entries of a field's season: weighed loads per lane (or part of a lane, or its outside or
// inside rows), each with a copy of its lanes as they stood when it was logged.
import type { Knex } from 'knex';
import { z } from 'zod';
import Papa from 'papaparse';
import { db } from './db';
import { recordAudit } from './audit';
import { invalid, notFound, versionConflict } from './errors';
import { getField } from './fields';
import { canSeeField, isUuid, type FarmAccess } from './access';
import { harvestFigures, harvestProblems, ROW_POSITIONS, type HarvestLane, type RowPosition } from '../harvest/entry';
import type { GrainCrop } from '../agronomy/index';

export const harvestEntrySchema = z.object({
	laneIndexes: z.array(z.number().int().min(0).max(100_000)).min(1, 'Choose at least one lane.').max(1000),
	crop: z.string().trim().toLowerCase().min(1, 'Name the crop.').max(60),
	wetWeightLb: z.number().finite(),
	moisturePct: z.number().finite(),
	lengthFt: z.number().finite().positive('The length must be more than 0 ft.').max(100_000).nullish(),
	rows: z.number().int('Rows are a whole number.').positive('Rows must be more than 0.').max(1000).nullish(),
	rowSpacingIn: z.number().finite().positive('Row spacing must be more than 0 in.').max(240).nullish(),
	rowPosition: z.enum(ROW_POSITIONS).default('all'),
	harvestedOn: z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'A date as YYYY-MM-DD.').nullish(),
	notes: z.string().max(2000).nullish()
});
export type HarvestEntryInput = z.input<typeof harvestEntrySchema>;

export interface StoredLane extends HarvestLane {
	widthFt: number;
	variety: string | null;
	trialLabel: string | null;
	geometry: unknown;
}

export interface HarvestEntry {
	id: string;
	fieldId: string;
	season: number;
	crop: string;
	rowPosition: RowPosition;
	laneIndexes: number[];
	lanes: StoredLane[];
	harvestedOn: string | null;
	wetWeightLb: number;
	moisturePct: number;
	lengthFt: number | null;
	rows: number | null;
	rowSpacingIn: number | null;
	harvestedAcres: number;
	bushels: number;
	bushelsPerAcre: number;
	standardMoisturePct: number;
	poundsPerBushel: number;
	notes: string | null;
	version: number;
	createdAt: string;
	createdBy: string | null;
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Row = any;

/** The season's adopted plan and its lanes as stored; 404 for a field the member cannot see, null for no plan. */
export async function seasonLanes(access: FarmAccess, fieldId: string, season: number, q: Knex | Knex.Transaction = db()) {
	if (!isUuid(fieldId) || !canSeeField(access, fieldId)) throw notFound('field');
	const field = await q('fields').where({ id: fieldId, farm_id: access.farm.id }).whereNull('deleted_at').first('id');
	if (!field) throw notFound('field');
	const plan = await q('plans').where({ farm_id: access.farm.id, field_id: fieldId, season, adopted: true }).whereNull('deleted_at').first('id', 'version');
	if (!plan) return null;
	const rows = await q('plan_lanes').where({ plan_id: plan.id }).orderBy('lane_index')
		.select('lane_index', 'kind', 'crop', 'acres', 'width_ft', 'rows', 'border_rows', 'variety', 'trial_label', 'geometry');
	const lanes: StoredLane[] = rows.map((r: Row) => ({
		laneIndex: r.lane_index, kind: r.kind, crop: r.crop, acres: Number(r.acres), widthFt: Number(r.width_ft), rows: r.rows,
		borderRows: r.border_rows, variety: r.variety, trialLabel: r.trial_label, geometry: r.geometry
	}));
	return { planId: plan.id as string, planVersion: plan.version as number, lanes };
}

function toEntry(r: Row, lanes: StoredLane[]): HarvestEntry {
	return {
		id: r.id, fieldId: r.field_id, season: r.season, crop: r.crop, rowPosition: r.row_position,
		laneIndexes: lanes.map((l) => l.laneIndex), lanes,
		harvestedOn: r.harvested_on ? toDateText(r.harvested_on) : null,
		wetWeightLb: Number(r.wet_weight_lb), moisturePct: Number(r.moisture_pct),
		lengthFt: r.length_ft == null ? null : Number(r.length_ft), rows: r.rows, rowSpacingIn: r.row_spacing_in == null ? null : Number(r.row_spacing_in),
		harvestedAcres: Number(r.harvested_acres), bushels: Number(r.bushels), bushelsPerAcre: Number(r.bushels_per_acre),
		standardMoisturePct: Number(r.standard_moisture_pct), poundsPerBushel: Number(r.pounds_per_bushel),
		notes: r.notes, version: r.version, createdAt: new Date(r.created_at).toISOString(), createdBy: r.created_by_name ?? null
	};
}

function toDateText(d: Date | string): string {
	if (typeof d === 'string') return d.slice(0, 10);
	return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
}

function toStoredLane(r: Row): StoredLane {
	return {
		laneIndex: r.lane_index, kind: r.kind, crop: r.crop, acres: Number(r.lane_acres), widthFt: Number(r.width_ft), rows: r.rows,
		borderRows: r.border_rows, variety: r.variety, trialLabel: r.trial_label, geometry: r.geometry
	};
}

async function readEntries(q: Knex | Knex.Transaction, farmId: string, where: Record<string, unknown>): Promise<HarvestEntry[]> {
	const rows = await q('harvest_entries as h').leftJoin('users as u', 'u.id', 'h.created_by')
		.where({ 'h.farm_id': farmId, ...where }).whereNull('h.deleted_at')
		.orderBy([{ column: 'h.harvested_on', order: 'asc', nulls: 'last' }, { column: 'h.created_at', order: 'asc' }])
		.select('h.*', 'u.name as created_by_name');
	if (!rows.length) return [];
	const laneRows = await q('harvest_entry_lanes').whereIn('entry_id', rows.map((r: Row) => r.id)).orderBy('lane_index');
	const byEntry = new Map<string, StoredLane[]>();
	for (const l of laneRows) {
		const list = byEntry.get(l.entry_id) ?? [];
		list.push(toStoredLane(l));
		byEntry.set(l.entry_id, list);
	}
	return rows.map((r: Row) => toEntry(r, byEntry.get(r.id) ?? []));
}

/** The season's harvest entries of a field the member may read. */
export async function listHarvest(access: FarmAccess, fieldId: string, season: number): Promise<HarvestEntry[]> {
	if (!isUuid(fieldId) || !canSeeField(access, fieldId)) throw notFound('field');
	await getField(access, fieldId);
	return readEntries(db(), access.farm.id, { 'h.field_id': fieldId, 'h.season': season });
}

/** Weighs a load in: bushels at the crop's standard, bushels per acre; the lanes are copied as they stand. */
export async function createHarvestEntry(access: FarmAccess, fieldId: string, season: number, raw: HarvestEntryInput): Promise<HarvestEntry> {
	const input = harvestEntrySchema.parse(raw);
	await getField(access, fieldId);
	return db().transaction(async (trx) => {
		const plan = await seasonLanes(access, fieldId, season, trx);
		if (!plan) throw invalid(`The field has no adopted plan for ${season}: lay out the season's lanes before logging harvest.`, { laneIndexes: [`No plan for ${season}.`] });
		const byIndex = new Map(plan.lanes.map((l) => [l.laneIndex, l]));
		const indexes = [...new Set(input.laneIndexes)].sort((a, b) => a - b);
		const unknown = indexes.filter((i) => !byIndex.has(i));
		if (unknown.length) {
			const message = `Lane ${unknown.map((i) => i + 1).join(', ')} ${unknown.length === 1 ? 'is' : 'are'} not in the ${season} plan, which has lanes 1 to ${plan.lanes.length}.`;
			throw invalid(message, { laneIndexes: [message] });
		}
		const lanes = indexes.map((i) => byIndex.get(i)!);
		const problems = harvestProblems(input, lanes);
		if (Object.keys(problems).length) throw invalid(Object.values(problems).flat().join(' '), problems);
		const figures = harvestFigures({ ...input, crop: input.crop as GrainCrop }, lanes);
		if (!(figures.harvestedAcres > 0)) throw invalid('The harvested area comes to 0 ac; give the length, rows and spacing harvested.', { lengthFt: ['The area is 0 ac.'] });
		const [row] = await trx('harvest_entries').insert({
			farm_id: access.farm.id, field_id: fieldId, season, plan_id: plan.planId, plan_version: plan.planVersion,
			crop: input.crop, row_position: input.rowPosition, harvested_on: input.harvestedOn ?? null,
			wet_weight_lb: input.wetWeightLb, moisture_pct: input.moisturePct,
			length_ft: input.lengthFt ?? null, rows: input.rows ?? null, row_spacing_in: input.rowSpacingIn ?? null,
			harvested_acres: figures.harvestedAcres, standard_moisture_pct: figures.standardMoisturePct, pounds_per_bushel: figures.poundsPerBushel,
			bushels: figures.bushels, bushels_per_acre: figures.bushelsPerAcre, notes: input.notes?.trim() || null,
			created_by: access.user.id, updated_by: access.user.id
		}).returning('*');
		await trx('harvest_entry_lanes').insert(lanes.map((l) => ({
			farm_id: access.farm.id, entry_id: row.id, lane_index: l.laneIndex, kind: l.kind, crop: l.crop, lane_acres: l.acres,
			width_ft: l.widthFt, rows: l.rows, border_rows: l.borderRows, variety: l.variety, trial_label: l.trialLabel, geometry: JSON.stringify(l.geometry)
		})));
		const entry = toEntry({ ...row, created_by_name: access.user.name }, lanes);
		await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'harvest_entry', entityId: row.id, action: 'create', after: { ...entry, lanes: undefined } });
		return entry;
	});
}

/** Soft-deletes an entry; a stale version answers 409 and nothing changes. */
export async function deleteHarvestEntry(access: FarmAccess, fieldId: string, season: number, entryId: string, version: number): Promise<void> {
	if (!isUuid(entryId) || !isUuid(fieldId) || !canSeeField(access, fieldId)) throw notFound('harvest entry');
	await db().transaction(async (trx) => {
		const row = await trx('harvest_entries').where({ id: entryId, farm_id: access.farm.id, field_id: fieldId, season }).whereNull('deleted_at').forUpdate().first();
		if (!row) throw notFound('harvest entry');
		if (row.version !== version) throw versionConflict('harvest entry', row.version, version);
		await trx('harvest_entries').where({ id: entryId }).update({ deleted_at: trx.fn.now(), deleted_by: access.user.id, version: row.version + 1, updated_at: trx.fn.now(), updated_by: access.user.id });
		await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'harvest_entry', entityId: entryId, action: 'delete', before: row });
	});
}

/** The public JSON of an entry (API answers). */
export function entryJson(e: HarvestEntry) {
	const { lanes, ...rest } = e;
	return { ...rest, lanes: lanes.map(({ geometry: _g, ...l }) => l) };
}

const CSV_COLUMNS = ['season', 'harvested_on', 'lanes', 'crop', 'varieties', 'trial', 'row_position', 'wet_weight_lb', 'moisture_pct', 'length_ft', 'rows', 'row_spacing_in', 'harvested_acres', 'standard_moisture_pct', 'lb_per_bu', 'bushels', 'bu_per_ac', 'notes'];

/** The season's entries as CSV, one row per entry, lanes numbered from 1 as the pages show them. */
export function harvestCsv(entries: HarvestEntry[]): string {
	const join = (xs: (string | null)[]) => [...new Set(xs.filter((x): x is string => !!x))].join('; ');
	const rows = entries.map((e) => [
		e.season, e.harvestedOn ?? '', e.laneIndexes.map((i) => i + 1).join(' '), e.crop, join(e.lanes.map((l) => l.variety)), join(e.lanes.map((l) => l.trialLabel)),
		e.rowPosition, e.wetWeightLb, e.moisturePct, e.lengthFt ?? '', e.rows ?? '', e.rowSpacingIn ?? '',
		e.harvestedAcres.toFixed(4), e.standardMoisturePct, e.poundsPerBushel, e.bushels.toFixed(2), e.bushelsPerAcre.toFixed(2), e.notes ?? ''
	]);
	// A leading =, +, - or @ would run as a formula in a spreadsheet; quote it out.
	const safe = rows.map((r) => r.map((v) => (typeof v === 'string' && /^[=+\-@\t\r]/.test(v) ? `'${v}` : v)));
	return Papa.unparse({ fields: CSV_COLUMNS, data: safe });
}
