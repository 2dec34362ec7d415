// The season record book: operations logged lane by lane, kept as recorded, with their history.
import type { Knex } from 'knex';
import { db } from './db';
import { recordAudit } from './audit';
import { isUuid, type FarmAccess } from './access';
import { notFound, versionConflict } from './errors';
import { getField, type Field } from './fields';
import {
	acresOf,
	checkTimes,
	copyLanes,
	copyProducts,
	locationText,
	requireRupComplete,
	retotal,
	type LaneCopy,
	type ProductCopy,
	type RecordWarning
} from './record-build';
import { productTotal } from '../records/amounts';
import { isRestrictedUse, rupRecordedLate } from '../records/restricted-use';
import type { RecordInput, RecordPatch, RecordType } from '../schemas/records';

export interface RecordProduct extends ProductCopy {
	/** The total in the unit it is bought in (gal for liquids, lb for dry weights). */
	shownTotal: { amount: number; unit: string };
}

export interface RecordLane extends Omit<LaneCopy, 'geometry'> {
	geometry?: unknown;
}

export interface SeasonRecord {
	id: string;
	fieldId: string;
	season: number;
	type: RecordType;
	startedAt: string;
	endedAt: string;
	acres: number;
	laneIndexes: number[];
	lanes: RecordLane[];
	products: RecordProduct[];
	applicator: string | null;
	applicatorCertNumber: string | null;
	equipment: string | null;
	weather: { tempF: number | null; windMph: number | null; windFrom: string | null };
	details: Record<string, unknown>;
	location: string | null;
	notes: string | null;
	restrictedUse: boolean;
	/** When a restricted-use record first held every required element, and whether that was over 14 days after the work. */
	rupCompletedAt: string | null;
	rupLate: boolean;
	planId: string | null;
	planVersion: number | null;
	version: number;
	createdAt: string;
	createdBy: string | null;
	updatedAt: string;
	deletedAt: string | null;
}

export interface HistoryEntry {
	at: string;
	action: string;
	userId: string | null;
	userName: string | null;
	before: unknown;
	after: unknown;
}

const iso = (d: Date | string | null) => (d == null ? null : new Date(d).toISOString());

/** The field, if this member may see it; 404 otherwise (another farm's, deleted, or not granted). */
async function visibleField(access: FarmAccess, fieldId: string): Promise<Field> {
	return getField(access, fieldId);
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Row = any;

async function assemble(q: Knex, access: FarmAccess, ops: Row[], withGeometry = false): Promise<SeasonRecord[]> {
	if (!ops.length) return [];
	const ids = ops.map((o) => o.id);
	const laneCols = ['operation_id', 'lane_index', 'kind', 'crop', 'lane_acres', 'acres', 'from_ft', 'to_ft', ...(withGeometry ? ['geometry'] : [])];
	const [lanes, products] = await Promise.all([
		q('operation_lanes').where({ farm_id: access.farm.id }).whereIn('operation_id', ids).orderBy('lane_index').select(laneCols),
		q('operation_products').where({ farm_id: access.farm.id }).whereIn('operation_id', ids).orderBy('position').select('*')
	]);
	return ops.map((o) => {
		const myLanes: RecordLane[] = lanes
			.filter((l) => l.operation_id === o.id)
			.map((l) => ({
				laneIndex: l.lane_index,
				kind: l.kind,
				crop: l.crop,
				laneAcres: l.lane_acres,
				acres: l.acres,
				fromFt: l.from_ft,
				toFt: l.to_ft,
				...(withGeometry ? { geometry: l.geometry } : {})
			}));
		const myProducts: RecordProduct[] = products
			.filter((p) => p.operation_id === o.id)
			.map((p) => ({
				position: p.position,
				productId: p.product_id,
				productName: p.product_name,
				epaRegNo: p.epa_reg_no,
				restrictedUse: p.restricted_use,
				reiHours: p.rei_hours,
				phiDays: p.phi_days,
				grazingDays: p.grazing_days,
				rate: p.rate,
				rateUnit: p.rate_unit,
				total: p.total,
				totalUnit: p.total_unit,
				shownTotal: productTotal(p.rate, p.rate_unit, o.acres).shown
			}));
		const { location = null, ...details } = o.details ?? {};
		return {
			id: o.id,
			fieldId: o.field_id,
			season: o.season,
			type: o.type,
			startedAt: iso(o.started_at)!,
			endedAt: iso(o.ended_at)!,
			acres: o.acres,
			laneIndexes: myLanes.map((l) => l.laneIndex),
			lanes: myLanes,
			products: myProducts,
			applicator: o.applicator,
			applicatorCertNumber: o.applicator_cert_number,
			equipment: o.equipment_name,
			weather: { tempF: o.temp_f, windMph: o.wind_mph, windFrom: o.wind_from },
			details,
			location,
			notes: o.notes,
			restrictedUse: isRestrictedUse(myProducts),
			rupCompletedAt: iso(o.rup_completed_at),
			rupLate: o.rup_completed_at ? rupRecordedLate(new Date(o.ended_at), new Date(o.rup_completed_at), access.farm.timeZone) : false,
			planId: o.plan_id,
			planVersion: o.plan_version,
			version: o.version,
			createdAt: iso(o.created_at)!,
			createdBy: o.created_by,
			updatedAt: iso(o.updated_at)!,
			deletedAt: iso(o.deleted_at)
		};
	});
}

export interface RecordFilter {
	type?: string | null;
	laneIndex?: number | null;
	productId?: string | null;
	includeDeleted?: boolean;
}

/** The season's records of a field, oldest work first; deleted ones only when asked for. */
export async function listRecords(access: FarmAccess, fieldId: string, season: number, filter: RecordFilter = {}): Promise<SeasonRecord[]> {
	await visibleField(access, fieldId);
	const q = db()('operations as o').where({ 'o.farm_id': access.farm.id, 'o.field_id': fieldId, 'o.season': season });
	if (!filter.includeDeleted) q.whereNull('o.deleted_at');
	if (filter.type) q.where('o.type', filter.type);
	if (filter.laneIndex != null) q.whereExists((s) => s.from('operation_lanes as ol').whereRaw('ol.operation_id = o.id').where('ol.lane_index', filter.laneIndex!));
	if (filter.productId) {
		if (!isUuid(filter.productId)) return [];
		q.whereExists((s) => s.from('operation_products as op').whereRaw('op.operation_id = o.id').where('op.product_id', filter.productId!));
	}
	const ops = await q.orderBy([{ column: 'o.ended_at' }, { column: 'o.created_at' }]).select('o.*');
	return assemble(db(), access, ops);
}

async function readRecord(q: Knex, access: FarmAccess, fieldId: string, season: number, recordId: string, lock = false): Promise<Row> {
	if (!isUuid(recordId)) throw notFound('record');
	const query = q('operations').where({ id: recordId, farm_id: access.farm.id, field_id: fieldId, season });
	if (lock) query.forUpdate();
	const row = await query.first();
	if (!row) throw notFound('record');
	return row;
}

/** One record, deleted or not, with its lanes' outlines as logged and its audit history. */
export async function getRecord(access: FarmAccess, fieldId: string, season: number, recordId: string): Promise<SeasonRecord & { history: HistoryEntry[] }> {
	await visibleField(access, fieldId);
	const row = await readRecord(db(), access, fieldId, season, recordId);
	const [record] = await assemble(db(), access, [row], true);
	const history = await db()('audit_log as a')
		.leftJoin('users as u', 'u.id', 'a.user_id')
		.where({ 'a.farm_id': access.farm.id, 'a.entity': 'record', 'a.entity_id': recordId })
		.orderBy('a.id')
		.select('a.at', 'a.action', 'a.user_id', 'u.name as user_name', 'a.before', 'a.after');
	return {
		...record,
		history: history.map((h) => ({ at: iso(h.at)!, action: h.action, userId: h.user_id, userName: h.user_name, before: h.before, after: h.after }))
	};
}

/** What the audit log keeps of a record: everything but the lane outlines (those stay on the lanes). */
function snapshot(r: SeasonRecord) {
	const { lanes, products, ...rest } = r;
	return {
		...rest,
		lanes: lanes.map(({ geometry: _g, ...l }) => l),
		products: products.map(({ shownTotal: _s, ...p }) => p)
	};
}

async function writeChildren(trx: Knex.Transaction, access: FarmAccess, operationId: string, lanes: LaneCopy[] | null, products: ProductCopy[] | null) {
	if (lanes) {
		await trx('operation_lanes').where({ operation_id: operationId }).delete();
		const rows = lanes.map((l) => ({
			farm_id: access.farm.id,
			operation_id: operationId,
			lane_index: l.laneIndex,
			kind: l.kind,
			crop: l.crop,
			lane_acres: l.laneAcres,
			acres: l.acres,
			from_ft: l.fromFt,
			to_ft: l.toFt,
			geometry: JSON.stringify(l.geometry)
		}));
		for (let i = 0; i < rows.length; i += 500) await trx('operation_lanes').insert(rows.slice(i, i + 500));
	}
	if (products) {
		await trx('operation_products').where({ operation_id: operationId }).delete();
		if (products.length) {
			await trx('operation_products').insert(
				products.map((p) => ({
					farm_id: access.farm.id,
					operation_id: operationId,
					product_id: p.productId,
					position: p.position,
					rate: p.rate,
					rate_unit: p.rateUnit,
					total: p.total,
					total_unit: p.totalUnit,
					product_name: p.productName,
					epa_reg_no: p.epaRegNo,
					restricted_use: p.restrictedUse,
					rei_hours: p.reiHours,
					phi_days: p.phiDays,
					grazing_days: p.grazingDays
				}))
			);
		}
	}
}

function scalarColumns(input: Pick<RecordInput, 'type' | 'applicator' | 'applicatorCertNumber' | 'equipment' | 'weather' | 'notes'> & { startedAt: Date; endedAt: Date; details: Record<string, unknown> }) {
	return {
		type: input.type,
		started_at: input.startedAt,
		ended_at: input.endedAt,
		applicator: input.applicator || null,
		applicator_cert_number: input.applicatorCertNumber || null,
		equipment_name: input.equipment || null,
		temp_f: input.weather?.tempF ?? null,
		wind_mph: input.weather?.windMph ?? null,
		wind_from: input.weather?.windFrom || null,
		// Only the facts given: an empty input is not kept as null.
		details: JSON.stringify(Object.fromEntries(Object.entries(input.details).filter(([, v]) => v != null && v !== ''))),
		notes: input.notes || null
	};
}

/**
 * Logs work done on lanes of the season's adopted plan. Lanes and the products' label data are
 * copied as they stand now; one transaction writes the record, its lanes, its products and the
 * audit entry. Rates above the usual most are kept, with warnings.
 */
export async function createRecord(access: FarmAccess, fieldId: string, season: number, input: RecordInput): Promise<{ record: SeasonRecord; warnings: RecordWarning[] }> {
	const field = await visibleField(access, fieldId);
	const startedAt = new Date(input.startedAt);
	const endedAt = new Date(input.endedAt);
	checkTimes(startedAt, endedAt, season, access.farm.timeZone);
	return db().transaction(async (trx) => {
		const { planId, planVersion, lanes } = await copyLanes(trx, access, fieldId, season, input.laneIndexes, input.laneParts);
		const acres = acresOf(lanes);
		const { products, warnings } = await copyProducts(trx, access, input.products, acres);
		const location = locationText(field, lanes);
		requireRupComplete({ products, location, acres, lanes, endedAt, applicator: input.applicator, applicatorCertNumber: input.applicatorCertNumber });
		const [row] = await trx('operations')
			.insert({
				farm_id: access.farm.id,
				field_id: fieldId,
				season,
				plan_id: planId,
				plan_version: planVersion,
				acres,
				...scalarColumns({ ...input, startedAt, endedAt, details: { ...(input.details ?? {}), location } }),
				rup_completed_at: isRestrictedUse(products) ? trx.fn.now() : null,
				created_by: access.user.id,
				updated_by: access.user.id
			})
			.returning('*');
		await writeChildren(trx, access, row.id, lanes, products);
		const [record] = await assemble(trx, access, [row]);
		await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'record', entityId: row.id, action: 'create', after: snapshot(record) });
		return { record, warnings };
	});
}

/**
 * Edits a record with optimistic concurrency (a stale `version` gets 409 and changes nothing).
 * Lanes are copied from the plan again only when the lanes change; product lines take fresh label
 * data only when the products are sent; otherwise their copies stay as logged and only totals follow
 * new acres.
 */
export async function updateRecord(access: FarmAccess, fieldId: string, season: number, recordId: string, patch: RecordPatch): Promise<{ record: SeasonRecord; warnings: RecordWarning[] }> {
	const field = await visibleField(access, fieldId);
	return db().transaction(async (trx) => {
		const row = await readRecord(trx, access, fieldId, season, recordId, true);
		if (row.deleted_at) throw notFound('record (it was deleted; restore it first)');
		if (row.version !== patch.version) throw versionConflict('record', row.version, patch.version);
		const [before] = await assemble(trx, access, [row], true);
		const startedAt = new Date(patch.startedAt ?? before.startedAt);
		const endedAt = new Date(patch.endedAt ?? before.endedAt);
		checkTimes(startedAt, endedAt, season, access.farm.timeZone);

		const lanesChange = patch.laneIndexes !== undefined || patch.laneParts !== undefined;
		let lanes: LaneCopy[] = before.lanes as LaneCopy[];
		let planId = row.plan_id;
		let planVersion = row.plan_version;
		if (lanesChange) {
			const indexes = patch.laneIndexes ?? before.laneIndexes;
			const parts = patch.laneParts ?? before.lanes.filter((l) => l.fromFt != null && l.toFt != null && indexes.includes(l.laneIndex)).map((l) => ({ laneIndex: l.laneIndex, fromFt: l.fromFt!, toFt: l.toFt! }));
			({ planId, planVersion, lanes } = await copyLanes(trx, access, fieldId, season, indexes, parts));
		}
		const acres = acresOf(lanes);
		let products: ProductCopy[];
		let warnings: RecordWarning[] = [];
		if (patch.products !== undefined) ({ products, warnings } = await copyProducts(trx, access, patch.products, acres));
		else products = retotal(before.products.map(({ shownTotal: _s, ...p }) => p), acres);

		const keep = <T>(sent: T | undefined, stored: T) => (sent === undefined ? stored : sent);
		const applicator = keep(patch.applicator, before.applicator);
		const applicatorCertNumber = keep(patch.applicatorCertNumber, before.applicatorCertNumber);
		const location = lanesChange ? locationText(field, lanes) : (before.location ?? locationText(field, lanes));
		requireRupComplete({ products, location, acres, lanes, endedAt, applicator, applicatorCertNumber });

		const [updated] = await trx('operations')
			.where({ id: row.id })
			.update({
				...scalarColumns({
					type: patch.type ?? before.type,
					startedAt,
					endedAt,
					applicator,
					applicatorCertNumber,
					equipment: keep(patch.equipment, before.equipment),
					weather: patch.weather === undefined ? before.weather : patch.weather,
					notes: keep(patch.notes, before.notes),
					details: { ...(patch.details === undefined ? before.details : (patch.details ?? {})), location }
				}),
				plan_id: planId,
				plan_version: planVersion,
				acres,
				// Completed when it first held every element; an edit later does not move that moment.
				rup_completed_at: isRestrictedUse(products) ? (row.rup_completed_at ?? trx.fn.now()) : null,
				version: row.version + 1,
				updated_by: access.user.id,
				updated_at: trx.fn.now()
			})
			.returning('*');
		await writeChildren(trx, access, row.id, lanesChange ? lanes : null, products);
		const [record] = await assemble(trx, access, [updated]);
		await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'record', entityId: row.id, action: 'update', before: snapshot(before), after: snapshot(record) });
		return { record, warnings };
	});
}

/** Soft delete: the record leaves the book and the restrictions, and a manager can bring it back. */
export async function deleteRecord(access: FarmAccess, fieldId: string, season: number, recordId: string, version?: number): Promise<SeasonRecord> {
	await visibleField(access, fieldId);
	return db().transaction(async (trx) => {
		const row = await readRecord(trx, access, fieldId, season, recordId, true);
		if (row.deleted_at) throw notFound('record');
		if (version !== undefined && row.version !== version) throw versionConflict('record', row.version, version);
		const [updated] = await trx('operations')
			.where({ id: row.id })
			.update({ deleted_at: trx.fn.now(), deleted_by: access.user.id, version: row.version + 1, updated_at: trx.fn.now() })
			.returning('*');
		const [record] = await assemble(trx, access, [updated]);
		await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'record', entityId: row.id, action: 'delete', before: { version: row.version, deletedAt: null }, after: { version: updated.version, deletedAt: record.deletedAt } });
		return record;
	});
}

/** Brings a deleted record back as it was (owners and managers; the route checks the role). */
export async function restoreRecord(access: FarmAccess, fieldId: string, season: number, recordId: string): Promise<SeasonRecord> {
	await visibleField(access, fieldId);
	return db().transaction(async (trx) => {
		const row = await readRecord(trx, access, fieldId, season, recordId, true);
		if (!row.deleted_at) throw notFound('deleted record');
		const [updated] = await trx('operations')
			.where({ id: row.id })
			.update({ deleted_at: null, deleted_by: null, version: row.version + 1, updated_by: access.user.id, updated_at: trx.fn.now() })
			.returning('*');
		const [record] = await assemble(trx, access, [updated]);
		await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'record', entityId: row.id, action: 'restore', before: { version: row.version, deletedAt: iso(row.deleted_at) }, after: { version: updated.version, deletedAt: null } });
		return record;
	});
}
