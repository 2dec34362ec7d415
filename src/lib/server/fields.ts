import type { MultiPolygon, Polygon } from 'geojson';
import type { Knex } from 'knex';
import { db } from './db';
import { recordAudit } from './audit';
import { canSeeField, isUuid, type FarmAccess } from './access';
import { AppError, invalid, notFound, versionConflict } from './errors';
import { GeometryError } from '../geometry/index';
import type { Exclusion, FieldMeasure } from '../fields/shape';
import { geometryPool } from './geometry-pool';
import type { FieldCreateInput, FieldPatchInput } from '../schemas/field';

export interface Field {
	id: string;
	farmId: string;
	name: string;
	boundary: Polygon | MultiPolygon;
	exclusions: Exclusion[];
	boundaryVersion: number;
	acres: number;
	excludedAcres: number;
	farmNumber: string | null;
	tractNumber: string | null;
	fieldNumber: string | null;
	landlord: string | null;
	notes: string | null;
	version: number;
	updatedAt: Date;
}

export interface BoundaryVersion {
	version: number;
	boundary: Polygon | MultiPolygon;
	exclusions: Exclusion[];
	acres: number;
	excludedAcres: number;
	reason: string | null;
	createdAt: Date;
	createdByName: string | null;
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function toField(r: any): Field {
	return {
		id: r.id,
		farmId: r.farm_id,
		name: r.name,
		boundary: r.boundary,
		exclusions: r.exclusions ?? [],
		boundaryVersion: r.boundary_version,
		acres: r.acres,
		excludedAcres: r.excluded_acres,
		farmNumber: r.farm_number,
		tractNumber: r.tract_number,
		fieldNumber: r.field_number,
		landlord: r.landlord,
		notes: r.notes,
		version: r.version,
		updatedAt: r.updated_at
	};
}

/**
 * Measures the outline in the geometry worker pool (a tangled outline never stalls other
 * requests), turning geometry problems into field errors on the right input.
 */
export async function measureOrRefuse(boundary: Polygon | MultiPolygon, exclusions: Exclusion[]): Promise<FieldMeasure> {
	try {
		return await geometryPool().run({ kind: 'measure-field', shape: { boundary, exclusions } });
	} catch (e) {
		if (e instanceof GeometryError) {
			const key = /exclusion/i.test(e.message) ? 'exclusions' : 'boundary';
			throw invalid(e.message, { [key]: [e.message] });
		}
		throw e;
	}
}

function scoped(access: FarmAccess) {
	const q = db()('fields').where({ farm_id: access.farm.id }).whereNull('deleted_at');
	return access.fieldScope === null ? q : q.whereIn('id', access.fieldScope);
}

export async function listFields(access: FarmAccess): Promise<Field[]> {
	const rows = await scoped(access).orderByRaw('lower(name)');
	return rows.map(toField);
}

export async function getField(access: FarmAccess, fieldId: string): Promise<Field> {
	const row = isUuid(fieldId) && canSeeField(access, fieldId) ? await scoped(access).where({ id: fieldId }).first() : undefined;
	if (!row) throw notFound('field');
	return toField(row);
}

function details(input: Partial<FieldCreateInput>) {
	const out: Record<string, unknown> = {};
	if (input.name !== undefined) out.name = input.name;
	if (input.farmNumber !== undefined) out.farm_number = input.farmNumber;
	if (input.tractNumber !== undefined) out.tract_number = input.tractNumber;
	if (input.fieldNumber !== undefined) out.field_number = input.fieldNumber;
	if (input.landlord !== undefined) out.landlord = input.landlord;
	if (input.notes !== undefined) out.notes = input.notes;
	return out;
}

function duplicateName(e: unknown, name: string | undefined) {
	if ((e as { code?: string }).code === '23505' && name) {
		return invalid(`This farm already has a field named ${name}.`, { name: [`This farm already has a field named ${name}.`] });
	}
	return e;
}

async function insertField(trx: Knex.Transaction, access: FarmAccess, input: FieldCreateInput, m: FieldMeasure): Promise<Field> {
	const boundary = input.boundary as Polygon | MultiPolygon;
	const exclusions = input.exclusions as Exclusion[];
	const [row] = await trx('fields')
		.insert({
			farm_id: access.farm.id,
			...details(input),
			boundary: JSON.stringify(boundary),
			exclusions: JSON.stringify(exclusions),
			acres: m.acres,
			excluded_acres: m.excludedAcres,
			created_by: access.user.id
		})
		.returning('*');
	await trx('field_boundary_versions').insert({
		farm_id: access.farm.id,
		field_id: row.id,
		version: 1,
		boundary: JSON.stringify(boundary),
		exclusions: JSON.stringify(exclusions),
		acres: m.acres,
		excluded_acres: m.excludedAcres,
		reason: 'first outline',
		created_by: access.user.id
	});
	await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'field', entityId: row.id, action: 'create', after: { name: row.name, acres: m.acres } });
	return toField(row);
}

export async function createField(access: FarmAccess, input: FieldCreateInput): Promise<Field> {
	return (await createFields(access, [input]))[0];
}

/**
 * Creates several fields all or nothing (an import never leaves half its fields behind). Outlines
 * are measured before the transaction, so no connection is held while the geometry runs.
 */
export async function createFields(access: FarmAccess, inputs: FieldCreateInput[]): Promise<Field[]> {
	const measures: FieldMeasure[] = [];
	for (const input of inputs) measures.push(await measureOrRefuse(input.boundary as Polygon | MultiPolygon, input.exclusions as Exclusion[]));
	let current: string | undefined;
	try {
		return await db().transaction(async (trx) => {
			const out: Field[] = [];
			for (const [i, input] of inputs.entries()) {
				current = input.name;
				out.push(await insertField(trx, access, input, measures[i]));
			}
			return out;
		});
	} catch (e) {
		throw duplicateName(e, current);
	}
}

/**
 * Updates details and/or the outline. A new outline becomes a new boundary version; earlier
 * versions stay, so plans laid out on them keep their shape. The outline is measured before the
 * transaction; the version check under the row lock makes sure it is still the field measured.
 */
export async function updateField(access: FarmAccess, fieldId: string, patch: FieldPatchInput): Promise<Field> {
	const before = await getField(access, fieldId);
	if (patch.version !== before.version) throw versionConflict('field', before.version, patch.version);
	const outlineChanged = patch.boundary !== undefined || patch.exclusions !== undefined;
	const boundary = (patch.boundary ?? before.boundary) as Polygon | MultiPolygon;
	const exclusions = (patch.exclusions ?? before.exclusions) as Exclusion[];
	const m = outlineChanged ? await measureOrRefuse(boundary, exclusions) : null;
	try {
		return await db().transaction(async (trx) => {
			const current = await trx('fields').where({ id: fieldId, farm_id: access.farm.id }).whereNull('deleted_at').forUpdate().first();
			if (!current) throw notFound('field');
			if (patch.version !== current.version) throw versionConflict('field', current.version, patch.version);
			const changes: Record<string, unknown> = { ...details(patch), version: current.version + 1, updated_at: trx.fn.now() };
			if (m) {
				const boundaryVersion = current.boundary_version + 1;
				Object.assign(changes, {
					boundary: JSON.stringify(boundary),
					exclusions: JSON.stringify(exclusions),
					acres: m.acres,
					excluded_acres: m.excludedAcres,
					boundary_version: boundaryVersion
				});
				await trx('field_boundary_versions').insert({
					farm_id: access.farm.id,
					field_id: fieldId,
					version: boundaryVersion,
					boundary: JSON.stringify(boundary),
					exclusions: JSON.stringify(exclusions),
					acres: m.acres,
					excluded_acres: m.excludedAcres,
					reason: patch.reason ?? null,
					created_by: access.user.id
				});
			}
			const [row] = await trx('fields').where({ id: fieldId }).update(changes).returning('*');
			await recordAudit(trx, {
				farmId: access.farm.id,
				userId: access.user.id,
				entity: 'field',
				entityId: fieldId,
				action: outlineChanged ? 'edit_outline' : 'edit',
				before: { name: current.name, acres: current.acres, boundaryVersion: current.boundary_version, version: current.version },
				after: { name: row.name, acres: row.acres, boundaryVersion: row.boundary_version, version: row.version }
			});
			return toField(row);
		});
	} catch (e) {
		throw duplicateName(e, patch.name);
	}
}

export async function deleteField(access: FarmAccess, fieldId: string): Promise<void> {
	await getField(access, fieldId);
	await db().transaction(async (trx) => {
		await trx('fields').where({ id: fieldId, farm_id: access.farm.id }).update({ deleted_at: trx.fn.now() });
		await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'field', entityId: fieldId, action: 'delete' });
	});
}

function boundaryVersions(access: FarmAccess, fieldId: string) {
	return db()('field_boundary_versions as v')
		.leftJoin('users as u', 'u.id', 'v.created_by')
		.where({ 'v.field_id': fieldId, 'v.farm_id': access.farm.id })
		.select('v.*', 'u.name as created_by_name');
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
function toBoundaryVersion(r: any): BoundaryVersion {
	return {
		version: r.version,
		boundary: r.boundary,
		exclusions: r.exclusions,
		acres: r.acres,
		excludedAcres: r.excluded_acres,
		reason: r.reason,
		createdAt: r.created_at,
		createdByName: r.created_by_name
	};
}

export async function listBoundaryVersions(access: FarmAccess, fieldId: string): Promise<BoundaryVersion[]> {
	await getField(access, fieldId);
	return (await boundaryVersions(access, fieldId).orderBy('v.version', 'desc')).map(toBoundaryVersion);
}

/** One outline of the field's history (every plan page reads this; no need to fetch them all). */
export async function getBoundaryVersion(access: FarmAccess, fieldId: string, version: number): Promise<BoundaryVersion> {
	const row = isUuid(fieldId) && canSeeField(access, fieldId)
		? await boundaryVersions(access, fieldId).join('fields as f', 'f.id', 'v.field_id').whereNull('f.deleted_at').where('v.version', version).first()
		: undefined;
	if (!row) {
		await getField(access, fieldId); // a missing field says so, not "no boundary version"
		throw notFound('boundary version');
	}
	return toBoundaryVersion(row);
}

export { AppError };
