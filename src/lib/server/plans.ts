import type { Knex } from 'knex';
import type { MultiPolygon, Polygon } from 'geojson';
import { db } from './db';
import { recordAudit } from './audit';
import type { FarmAccess } from './access';
import { AppError, invalid, notFound, versionConflict } from './errors';
import { getBoundaryVersion, getField } from './fields';
import { GeometryError, layoutStrips, rotationMatrix, type Lane, type LaneSpec, type Layout, type LngLat } from '../geometry/index';
import type { LaneAssignment } from '../plans/types';
import type { NextSeasonInput, PlanSaveInput } from '../schemas/plan';
import { describeShift, shiftFeet } from '../plans/shift';
import { rotationWarnings, type RotationWarning } from '../plans/rotation-flags';
import type { Exclusion } from '../fields/shape';

export interface PlanLane extends Lane {
	assignment: LaneAssignment | null;
}

export interface Plan {
	id: string;
	fieldId: string;
	season: number;
	variant: string;
	adopted: boolean;
	guidance: { a: LngLat; b: LngLat };
	pattern: LaneSpec[];
	offsetFt: number;
	headlandFt: number;
	boundaryVersion: number;
	assignments: LaneAssignment[];
	notes: string | null;
	version: number;
	fieldAcres: number;
	plantedAcres: number;
	updatedAt: Date;
	lanes: PlanLane[];
	byCrop: Layout['byCrop'];
	headlandAcres: number;
	excludedAcres: number;
}

export interface PlanSummary {
	id: string;
	season: number;
	variant: string;
	adopted: boolean;
	version: number;
	plantedAcres: number;
	updatedAt: Date;
}

/** GeometryError → 400 with the error on the input that caused it. */
export function refuseLayoutError(e: GeometryError): AppError {
	const key = e.code.startsWith('ab-')
		? 'guidance'
		: e.code === 'empty-pattern' || e.code === 'invalid-lane'
			? 'pattern'
			: e.code === 'invalid-number'
				? /headland/i.test(e.message) ? 'headlandFt' : 'offsetFt'
				: 'boundary';
	return invalid(e.message, { [key]: [e.message] });
}

export function computeLayout(
	boundary: Polygon | MultiPolygon,
	exclusions: Exclusion[],
	settings: { guidance: { a: LngLat; b: LngLat }; pattern: LaneSpec[]; offsetFt: number; headlandFt: number }
): Layout {
	try {
		return layoutStrips({
			boundary,
			exclusions: exclusions.map((x) => x.geometry),
			guidance: settings.guidance,
			pattern: settings.pattern,
			offsetFt: settings.offsetFt,
			headlandFt: settings.headlandFt
		});
	} catch (e) {
		if (e instanceof GeometryError) throw refuseLayoutError(e);
		throw e;
	}
}

function withAssignments(lanes: Lane[], assignments: LaneAssignment[]): PlanLane[] {
	const byIndex = new Map(assignments.map((a) => [a.laneIndex, a]));
	return lanes.map((l) => ({ ...l, assignment: byIndex.get(l.index) ?? null }));
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Row = any;

async function hydrate(access: FarmAccess, row: Row): Promise<Plan> {
	const boundary = await getBoundaryVersion(access, row.field_id, row.boundary_version);
	const settings = { guidance: row.guidance, pattern: row.pattern, offsetFt: row.offset_ft, headlandFt: row.headland_ft };
	const layout = computeLayout(boundary.boundary, boundary.exclusions, settings);
	return toPlan(row, layout);
}

function toPlan(row: Row, layout: Layout): Plan {
	return {
		id: row.id,
		fieldId: row.field_id,
		season: row.season,
		variant: row.variant,
		adopted: row.adopted,
		guidance: row.guidance,
		pattern: row.pattern,
		offsetFt: row.offset_ft,
		headlandFt: row.headland_ft,
		boundaryVersion: row.boundary_version,
		assignments: row.assignments ?? [],
		notes: row.notes,
		version: row.version,
		fieldAcres: layout.fieldAcres,
		plantedAcres: layout.plantedAcres,
		updatedAt: row.updated_at,
		lanes: withAssignments(layout.lanes, row.assignments ?? []),
		byCrop: layout.byCrop,
		headlandAcres: layout.headlandAcres,
		excludedAcres: layout.excludedAcres
	};
}

function planRows(trx: Knex | Knex.Transaction, access: FarmAccess, fieldId: string) {
	return trx('plans').where({ farm_id: access.farm.id, field_id: fieldId }).whereNull('deleted_at');
}

export async function listPlans(access: FarmAccess, fieldId: string): Promise<PlanSummary[]> {
	await getField(access, fieldId);
	const rows = await planRows(db(), access, fieldId).orderBy([{ column: 'season', order: 'desc' }, { column: 'adopted', order: 'desc' }, { column: 'variant' }]);
	return rows.map((r: Row) => ({ id: r.id, season: r.season, variant: r.variant, adopted: r.adopted, version: r.version, plantedAcres: r.planted_acres, updatedAt: r.updated_at }));
}

/** The season's adopted plan, or the named variant. */
export async function getPlan(access: FarmAccess, fieldId: string, season: number, variant?: string): Promise<Plan> {
	await getField(access, fieldId);
	const q = planRows(db(), access, fieldId).where({ season });
	const row = await (variant ? q.whereRaw('lower(variant) = lower(?)', [variant]) : q.where({ adopted: true })).first();
	if (!row) throw notFound(variant ? `plan variant "${variant}" for ${season}` : `adopted plan for ${season}`);
	return hydrate(access, row);
}

async function writeLanes(trx: Knex.Transaction, access: FarmAccess, planId: string, lanes: PlanLane[]) {
	await trx('plan_lanes').where({ plan_id: planId }).delete();
	const rows = lanes.map((l) => ({
		farm_id: access.farm.id,
		plan_id: planId,
		lane_index: l.index,
		pattern_index: l.patternIndex,
		kind: l.kind,
		crop: l.crop,
		width_ft: l.widthFt,
		rows: l.rows,
		offset_ft: l.offsetFt,
		geometry: JSON.stringify(l.geometry),
		acres: l.acres,
		row_feet: l.rowFeet,
		border_rows: l.borderRows,
		variety: l.assignment?.variety ?? null,
		relative_maturity: l.assignment?.relativeMaturity ?? null,
		population_per_acre: l.assignment?.populationPerAcre ?? null,
		seed_lot: l.assignment?.seedLot ?? null,
		trial_label: l.assignment?.trialLabel ?? null,
		notes: l.assignment?.notes ?? null
	}));
	for (let i = 0; i < rows.length; i += 500) await trx('plan_lanes').insert(rows.slice(i, i + 500));
}

/**
 * Creates (version 0) or updates a season's plan variant with optimistic concurrency: a stale
 * version gets 409 and nothing changes. The first plan of a season is adopted.
 */
export async function savePlan(access: FarmAccess, fieldId: string, season: number, input: PlanSaveInput): Promise<Plan> {
	const field = await getField(access, fieldId);
	return db().transaction(async (trx) => {
		// Lock the field row: two first saves of the same season cannot both create a plan.
		await trx('fields').where({ id: field.id }).forUpdate().first('id');
		const current = await planRows(trx, access, fieldId).where({ season }).whereRaw('lower(variant) = lower(?)', [input.variant]).forUpdate().first();
		const stored = current?.version ?? 0;
		if (input.version !== stored) throw versionConflict('plan', stored, input.version);
		const boundaryVersion = !current || input.rebase ? field.boundaryVersion : current.boundary_version;
		const outline = await getBoundaryVersion(access, fieldId, boundaryVersion);
		const layout = computeLayout(outline.boundary, outline.exclusions, input);
		const assignments = input.assignments.filter((a) => layout.lanes.some((l) => l.index === a.laneIndex));
		const values = {
			guidance: JSON.stringify(input.guidance),
			pattern: JSON.stringify(input.pattern),
			offset_ft: input.offsetFt,
			headland_ft: input.headlandFt,
			boundary_version: boundaryVersion,
			assignments: JSON.stringify(assignments),
			field_acres: layout.fieldAcres,
			planted_acres: layout.plantedAcres,
			notes: input.notes,
			updated_at: trx.fn.now()
		};
		let row: Row;
		if (current) {
			[row] = await trx('plans').where({ id: current.id }).update({ ...values, version: stored + 1 }).returning('*');
		} else {
			const hasAdopted = await planRows(trx, access, fieldId).where({ season, adopted: true }).first('id');
			[row] = await trx('plans')
				.insert({ ...values, farm_id: access.farm.id, field_id: fieldId, season, variant: input.variant, adopted: !hasAdopted, version: 1, created_by: access.user.id })
				.returning('*');
		}
		const plan = toPlan(row, layout);
		await writeLanes(trx, access, row.id, plan.lanes);
		await recordAudit(trx, {
			farmId: access.farm.id,
			userId: access.user.id,
			entity: 'plan',
			entityId: row.id,
			action: current ? 'update' : 'create',
			before: current ? { version: current.version, pattern: current.pattern, offsetFt: current.offset_ft, headlandFt: current.headland_ft, guidance: current.guidance } : undefined,
			after: { version: row.version, pattern: input.pattern, offsetFt: input.offsetFt, headlandFt: input.headlandFt, guidance: input.guidance }
		});
		return plan;
	});
}

export async function adoptVariant(access: FarmAccess, fieldId: string, season: number, variant: string): Promise<Plan> {
	await getField(access, fieldId);
	await db().transaction(async (trx) => {
		const target = await planRows(trx, access, fieldId).where({ season }).whereRaw('lower(variant) = lower(?)', [variant]).forUpdate().first();
		if (!target) throw notFound(`plan variant "${variant}" for ${season}`);
		await trx('plans').where({ farm_id: access.farm.id, field_id: fieldId, season }).update({ adopted: false });
		await trx('plans').where({ id: target.id }).update({ adopted: true, updated_at: trx.fn.now() });
		await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'plan', entityId: target.id, action: 'adopt', after: { season, variant } });
	});
	return getPlan(access, fieldId, season);
}

export async function deletePlanVariant(access: FarmAccess, fieldId: string, season: number, variant: string) {
	await getField(access, fieldId);
	await db().transaction(async (trx) => {
		const target = await planRows(trx, access, fieldId).where({ season }).whereRaw('lower(variant) = lower(?)', [variant]).forUpdate().first();
		if (!target) throw notFound(`plan variant "${variant}" for ${season}`);
		if (target.adopted) throw invalid('Adopt another variant before deleting the adopted one.');
		await trx('plans').where({ id: target.id }).update({ deleted_at: trx.fn.now() });
		await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'plan', entityId: target.id, action: 'delete' });
	});
}

export interface NextSeasonResult {
	plan: Plan;
	rotation: { from: string; to: string; acres: number }[];
	warnings: RotationWarning[];
	shiftFt: number;
	shiftDescription: string;
}

/** Creates next season's adopted plan from this season's, shifted, and compares the two. */
export async function planNextSeason(access: FarmAccess, fieldId: string, season: number, input: NextSeasonInput): Promise<NextSeasonResult> {
	const previous = await getPlan(access, fieldId, season);
	const shiftFt = shiftFeet(previous.pattern, input.shift);
	const exists = await planRows(db(), access, fieldId).where({ season: season + 1 }).whereRaw('lower(variant) = lower(?)', [input.variant ?? 'main']).first('id');
	if (exists) throw new AppError(409, `${season + 1} already has a plan${input.variant ? ` named "${input.variant}"` : ''}. Open it, or name a new variant.`, 'already_planned');
	const plan = await savePlan(access, fieldId, season + 1, {
		guidance: previous.guidance,
		pattern: previous.pattern,
		offsetFt: Math.round((previous.offsetFt + shiftFt) * 10_000) / 10_000,
		headlandFt: previous.headlandFt,
		version: 0,
		variant: input.variant ?? 'main',
		assignments: [],
		notes: null,
		rebase: true
	});
	const rotation = rotationMatrix(previous.lanes, plan.lanes);
	return { plan, rotation, warnings: rotationWarnings(previous.lanes, plan.lanes, rotation, true), shiftFt, shiftDescription: describeShift(previous.pattern, input.shift) };
}

/** Rotation from the previous season's adopted plan to this one, when there is one. */
export async function rotationFromPrevious(access: FarmAccess, plan: Plan) {
	let previous: Plan;
	try {
		previous = await getPlan(access, plan.fieldId, plan.season - 1);
	} catch (e) {
		if (e instanceof AppError && e.status === 404) return null;
		throw e;
	}
	const rotation = rotationMatrix(previous.lanes, plan.lanes);
	const sameGuidance = JSON.stringify(previous.guidance) === JSON.stringify(plan.guidance);
	return { previousSeason: previous.season, rotation, warnings: rotationWarnings(previous.lanes, plan.lanes, rotation, sameGuidance) };
}
