import type { Knex } from 'knex';
import type { MultiPolygon, Polygon } from 'geojson';
import { db } from './db';
import { recordAudit } from './audit';
import { AppError, invalid, notFound, versionConflict } from './errors';
import { getBoundaryVersion, getField } from './fields';
import { canSeeField, isUuid, type FarmAccess } from './access';
import { GeometryError, rotationMatrix, type Lane, type LaneSpec, type Layout, type LngLat } from '../geometry/index';
import type { LaneAssignment } from '../plans/types';
import type { NextSeasonInput, PlanSaveInput } from '../schemas/plan';
import { describeShift, shiftFeet } from '../plans/shift';
import { rotationWarnings, type RotationWarning } from '../plans/rotation-flags';
import type { Exclusion } from '../fields/shape';
import { checkVarietyCrops } from './varieties';
import { versionedMemo } from './versioned-memo';
import type { Field } from './fields';

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
		: e.code === 'empty-pattern' || e.code === 'invalid-lane' || e.code === 'too-many-lanes'
			? 'pattern'
			: e.code === 'invalid-number'
				? /headland/i.test(e.message) ? 'headlandFt' : 'offsetFt'
				: 'boundary';
	return invalid(e.message, { [key]: [e.message] });
}

/** Lays the plan out on an outline: only saving (or an explicit re-layout) calls this, never a read. */
export async function computeLayout(
	boundary: Polygon | MultiPolygon,
	exclusions: Exclusion[],
	settings: { guidance: { a: LngLat; b: LngLat }; pattern: LaneSpec[]; offsetFt: number; headlandFt: number }
): Promise<Layout> {
	// Off the request thread, under the pool's time limit: one big field never stalls the others.
	const { geometryPool } = await import('./geometry-pool');
	try {
		return await geometryPool().run({
			kind: 'layout',
			input: {
				boundary,
				exclusions: exclusions.map((x) => x.geometry),
				guidance: settings.guidance,
				pattern: settings.pattern,
				offsetFt: settings.offsetFt,
				headlandFt: settings.headlandFt
			}
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

type Db = Knex | Knex.Transaction;

const LANE_COLUMNS = [
	'lane_index', 'pattern_index', 'kind', 'crop', 'width_ft', 'rows', 'offset_ft', 'geometry', 'acres', 'row_feet', 'border_rows',
	'variety', 'relative_maturity', 'population_per_acre', 'seed_lot', 'trial_label', 'notes'
];

function toAssignment(r: Row): LaneAssignment | null {
	const a = { variety: r.variety, relativeMaturity: r.relative_maturity, populationPerAcre: r.population_per_acre, seedLot: r.seed_lot, trialLabel: r.trial_label, notes: r.notes };
	return Object.values(a).some((v) => v !== null) ? { laneIndex: r.lane_index, ...a } : null;
}

function toLane(r: Row): PlanLane {
	return {
		index: r.lane_index,
		patternIndex: r.pattern_index,
		kind: r.kind,
		crop: r.crop,
		widthFt: Number(r.width_ft),
		rows: r.rows,
		offsetFt: Number(r.offset_ft),
		geometry: r.geometry,
		acres: Number(r.acres),
		rowFeet: Number(r.row_feet),
		borderRows: r.border_rows,
		assignment: toAssignment(r)
	};
}

/** The plan's lanes exactly as they were saved, in order across the field. */
async function readLanes(q: Db, planId: string): Promise<PlanLane[]> {
	return (await q('plan_lanes').where({ plan_id: planId }).orderBy('lane_index').select(LANE_COLUMNS)).map(toLane);
}

// A saved version's lanes never change (every save writes a new version), so their rows are kept
// per plan id and version (see versioned-memo.ts). Outlines are kept as text and parsed for each
// reader, so no caller can change what the next one gets.
const laneRowsOfVersion = versionedMemo<Row[]>(64);
const VERSION_MOVED = new Error('the plan has a newer version');

async function readVersionLanes(planId: string, version: number): Promise<PlanLane[]> {
	let rows: Row[];
	try {
		rows = await laneRowsOfVersion.get(`${planId}:${version}`, async () => {
			// Joined on the version, so the rows read are that version's, never a newer save's.
			const found = await db()('plan_lanes as l')
				.join('plans as p', 'p.id', 'l.plan_id')
				.where({ 'p.id': planId, 'p.version': version })
				.orderBy('l.lane_index')
				.select([...LANE_COLUMNS.filter((c) => c !== 'geometry').map((c) => `l.${c}`), db().raw('l.geometry::text as geometry')]);
			if (!found.length) throw VERSION_MOVED; // not kept: read again below
			return found;
		});
	} catch (e) {
		if (e !== VERSION_MOVED) throw e;
		return readLanes(db(), planId);
	}
	return rows.map((r) => toLane({ ...r, geometry: JSON.parse(r.geometry) }));
}

function toPlan(row: Row, lanes: PlanLane[]): Plan {
	return {
		id: row.id,
		fieldId: row.field_id,
		season: row.season,
		variant: row.variant,
		adopted: row.adopted,
		guidance: row.guidance,
		pattern: row.pattern,
		offsetFt: Number(row.offset_ft),
		headlandFt: Number(row.headland_ft),
		boundaryVersion: row.boundary_version,
		assignments: row.assignments ?? [],
		notes: row.notes,
		version: row.version,
		fieldAcres: Number(row.field_acres),
		plantedAcres: Number(row.planted_acres),
		updatedAt: row.updated_at,
		lanes,
		byCrop: row.by_crop,
		headlandAcres: Number(row.headland_acres),
		excludedAcres: Number(row.excluded_acres)
	};
}

function planRows(trx: Db, access: FarmAccess, fieldId: string) {
	return trx('plans').where({ farm_id: access.farm.id, field_id: fieldId }).whereNull('deleted_at');
}

/** `field`: the field as this request already read it for this member, so it is not read twice. */
export async function listPlans(access: FarmAccess, fieldId: string, field?: Promise<Field>): Promise<PlanSummary[]> {
	await (field ?? getField(access, fieldId));
	// Only the summary columns: a plan row also holds every lane assignment and the settings.
	const rows = await planRows(db(), access, fieldId)
		.orderBy([{ column: 'season', order: 'desc' }, { column: 'adopted', order: 'desc' }, { column: 'variant' }])
		.select('id', 'season', 'variant', 'adopted', 'version', 'planted_acres', 'updated_at');
	return rows.map((r: Row) => ({ id: r.id, season: r.season, variant: r.variant, adopted: r.adopted, version: r.version, plantedAcres: r.planted_acres, updatedAt: r.updated_at }));
}

/**
 * The query for a season's adopted plan (or the named variant) as `p`, with its field as `f`, under
 * the farm, field-scope and deleted-row rules every plan read follows; null when this member may not
 * see the field at all.
 */
export function seasonPlanQuery(access: FarmAccess, fieldId: string, season: number, variant?: string): Knex.QueryBuilder | null {
	if (!isUuid(fieldId) || !canSeeField(access, fieldId)) return null;
	const q = db()('plans as p')
		.join('fields as f', 'f.id', 'p.field_id')
		.whereNull('f.deleted_at')
		.whereNull('p.deleted_at')
		.where({ 'p.farm_id': access.farm.id, 'p.field_id': fieldId, 'p.season': season });
	return variant ? q.whereRaw('lower(p.variant) = lower(?)', [variant]) : q.where({ 'p.adopted': true });
}

/**
 * The season's adopted plan, or the named variant, read as it was saved: the plan row and its
 * stored lanes (two queries at most, whatever the lane count; lanes are kept per version), never
 * laid out again.
 */
export async function getPlan(access: FarmAccess, fieldId: string, season: number, variant?: string): Promise<Plan> {
	const q = seasonPlanQuery(access, fieldId, season, variant);
	if (!q) throw notFound('field');
	// Prepared once per connection (one name per shape of the statement): every plan read runs it.
	const row = await q.options({ name: variant ? 'season_plan_variant' : 'season_plan' }).first('p.*');
	if (!row) {
		await getField(access, fieldId); // a missing field says so, not "no plan"
		throw notFound(variant ? `plan variant "${variant}" for ${season}` : `adopted plan for ${season}`);
	}
	return toPlan(row, await readVersionLanes(row.id, row.version));
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

/** JSON with object keys sorted, so settings read back from jsonb compare equal to the same input. */
function canonical(value: unknown): string {
	return JSON.stringify(value, (_k, v) => (v && typeof v === 'object' && !Array.isArray(v) ? Object.fromEntries(Object.entries(v).sort(([x], [y]) => (x < y ? -1 : 1))) : v));
}

function sameSettings(row: Row, input: PlanSaveInput): boolean {
	return (
		canonical(row.guidance) === canonical(input.guidance) &&
		canonical(row.pattern) === canonical(input.pattern) &&
		Number(row.offset_ft) === input.offsetFt &&
		Number(row.headland_ft) === input.headlandFt
	);
}

/**
 * Creates (version 0) or updates a season's plan variant with optimistic concurrency: a stale
 * version gets 409 and nothing changes. The first plan of a season is adopted.
 *
 * The plan is laid out again only when it is new, its settings changed, it moves to the field's
 * current outline (`rebase`) or the user asks for it (`relayout`); otherwise its stored lanes
 * stay as they are and only their assignments change. The layout runs before the transaction,
 * so no connection or row lock is held while geometry is computed.
 */
export async function savePlan(access: FarmAccess, fieldId: string, season: number, input: PlanSaveInput): Promise<Plan> {
	const field = await getField(access, fieldId);
	const current = await planRows(db(), access, fieldId).where({ season }).whereRaw('lower(variant) = lower(?)', [input.variant]).first();
	const stored = current?.version ?? 0;
	if (input.version !== stored) throw versionConflict('plan', stored, input.version);
	const boundaryVersion: number = !current || input.rebase ? field.boundaryVersion : current.boundary_version;
	const relayout = !current || input.rebase || input.relayout || !sameSettings(current, input);
	let layout: Layout | null = null;
	let lanes: Lane[];
	if (relayout) {
		const outline = await getBoundaryVersion(access, fieldId, boundaryVersion);
		layout = await computeLayout(outline.boundary, outline.exclusions, input);
		lanes = layout.lanes;
	} else {
		lanes = await readLanes(db(), current.id);
	}
	// A catalogue variety of another crop than its lane's is refused before anything is written.
	const named = await checkVarietyCrops(access, lanes, input.assignments);
	const assignments = named.filter((a) => lanes.some((l) => l.index === a.laneIndex));
	const planLanes = withAssignments(lanes, assignments);

	return db().transaction(async (trx) => {
		// Lock the field row: two first saves of the same season cannot both create a plan, and the
		// outline cannot change under a save that was laid out on it.
		const locked = await trx('fields').where({ id: field.id }).forUpdate().first('boundary_version');
		const again = await planRows(trx, access, fieldId).where({ season }).whereRaw('lower(variant) = lower(?)', [input.variant]).forUpdate().first();
		const now = again?.version ?? 0;
		if (now !== input.version) throw versionConflict('plan', now, input.version);
		if ((!current || input.rebase) && locked?.boundary_version !== boundaryVersion) {
			throw new AppError(409, 'The field outline changed while this plan was being saved. Reload and save again; nothing of yours was saved.', 'version_conflict');
		}
		const values: Record<string, unknown> = {
			guidance: JSON.stringify(input.guidance),
			pattern: JSON.stringify(input.pattern),
			offset_ft: input.offsetFt,
			headland_ft: input.headlandFt,
			boundary_version: boundaryVersion,
			assignments: JSON.stringify(assignments),
			notes: input.notes,
			updated_at: trx.fn.now()
		};
		if (layout) {
			Object.assign(values, {
				field_acres: layout.fieldAcres,
				planted_acres: layout.plantedAcres,
				headland_acres: layout.headlandAcres,
				excluded_acres: layout.excludedAcres,
				by_crop: JSON.stringify(layout.byCrop)
			});
		}
		let row: Row;
		if (current) {
			[row] = await trx('plans').where({ id: current.id }).update({ ...values, version: stored + 1 }).returning('*');
		} else {
			const hasAdopted = await planRows(trx, access, fieldId).where({ season, adopted: true }).first('id');
			[row] = await trx('plans')
				.insert({ ...values, farm_id: access.farm.id, field_id: fieldId, season, variant: input.variant, adopted: !hasAdopted, version: 1, created_by: access.user.id })
				.returning('*');
		}
		await writeLanes(trx, access, row.id, planLanes);
		await recordAudit(trx, {
			farmId: access.farm.id,
			userId: access.user.id,
			entity: 'plan',
			entityId: row.id,
			action: current ? (layout ? 'update' : 'update_assignments') : 'create',
			before: current ? { version: current.version, pattern: current.pattern, offsetFt: current.offset_ft, headlandFt: current.headland_ft, guidance: current.guidance } : undefined,
			after: { version: row.version, pattern: input.pattern, offsetFt: input.offsetFt, headlandFt: input.headlandFt, guidance: input.guidance, laidOut: Boolean(layout) }
		});
		return toPlan(row, planLanes);
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
	const variant = input.variant ?? 'main';
	const alreadyPlanned = () => new AppError(409, `${season + 1} already has a plan${input.variant ? ` named "${input.variant}"` : ''}. Open it, or name a new variant.`, 'already_planned');
	if (await planRows(db(), access, fieldId).where({ season: season + 1 }).whereRaw('lower(variant) = lower(?)', [variant]).first('id')) throw alreadyPlanned();
	let plan: Plan;
	try {
		plan = await savePlan(access, fieldId, season + 1, {
			guidance: previous.guidance,
			pattern: previous.pattern,
			offsetFt: Math.round((previous.offsetFt + shiftFt) * 10_000) / 10_000,
			headlandFt: previous.headlandFt,
			version: 0,
			variant,
			assignments: [],
			notes: null,
			rebase: true
		});
	} catch (e) {
		// Another request planned the season between the check above and the save.
		if (e instanceof AppError && e.code === 'version_conflict') throw alreadyPlanned();
		throw e;
	}
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
