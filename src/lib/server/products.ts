// The farm's product list: label data that records copy when work is logged.
import type { Knex } from 'knex';
import { db } from './db';
import { recordAudit } from './audit';
import { isUuid, type FarmAccess } from './access';
import { invalid, notFound, versionConflict } from './errors';
import type { ProductInput, ProductKind, ProductPatch } from '../schemas/products';

export interface Product {
	id: string;
	name: string;
	kind: ProductKind;
	unit: string;
	epaRegNo: string | null;
	restrictedUse: boolean;
	reiHours: number | null;
	phiDays: number | null;
	grazingDays: number | null;
	activeIngredients: string | null;
	formulation: string | null;
	analysis: string | null;
	poundsPerGallon: number | null;
	notes: string | null;
	version: number;
	createdAt: Date;
	updatedAt: Date;
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Row = any;

const num = (v: unknown) => (v === null || v === undefined ? null : Number(v));

export function toProduct(r: Row): Product {
	return {
		id: r.id,
		name: r.name,
		kind: r.kind,
		unit: r.unit,
		epaRegNo: r.epa_reg_no,
		restrictedUse: r.restricted_use,
		reiHours: num(r.rei_hours),
		phiDays: r.phi_days,
		grazingDays: r.grazing_days,
		activeIngredients: r.active_ingredients,
		formulation: r.formulation,
		analysis: r.analysis,
		poundsPerGallon: num(r.pounds_per_gallon),
		notes: r.notes,
		version: r.version,
		createdAt: r.created_at,
		updatedAt: r.updated_at
	};
}

const COLUMNS: Record<keyof ProductInput, string> = {
	name: 'name',
	kind: 'kind',
	unit: 'unit',
	epaRegNo: 'epa_reg_no',
	restrictedUse: 'restricted_use',
	reiHours: 'rei_hours',
	phiDays: 'phi_days',
	grazingDays: 'grazing_days',
	activeIngredients: 'active_ingredients',
	formulation: 'formulation',
	analysis: 'analysis',
	poundsPerGallon: 'pounds_per_gallon',
	notes: 'notes'
};

function rowValues(input: Partial<ProductInput>): Record<string, unknown> {
	const values: Record<string, unknown> = {};
	for (const [key, column] of Object.entries(COLUMNS)) {
		const v = input[key as keyof ProductInput];
		if (v !== undefined) values[column] = v;
	}
	return values;
}

const live = (q: Knex | Knex.Transaction, access: FarmAccess) => q('products').where({ farm_id: access.farm.id }).whereNull('deleted_at');

function duplicateName(name: string) {
	const message = `The farm already has a product named "${name}". Edit that one, or give this one another name.`;
	return invalid(message, { name: [message] });
}

async function refuseDuplicate(trx: Knex.Transaction, access: FarmAccess, name: string, exceptId?: string) {
	const q = live(trx, access).whereRaw('lower(name) = lower(?)', [name]);
	if (exceptId) q.whereNot({ id: exceptId });
	if (await q.first('id')) throw duplicateName(name);
}

/** Two saves racing past the name check still meet the unique index; that is the same 400. */
function fromUniqueViolation(e: unknown, name: string | undefined): unknown {
	const err = e as { code?: string; constraint?: string };
	return err.code === '23505' && err.constraint === 'products_name_key' && name ? duplicateName(name) : e;
}

export async function listProducts(access: FarmAccess): Promise<Product[]> {
	const rows = await live(db(), access).orderBy([{ column: 'kind' }, { column: 'name' }]);
	return rows.map(toProduct);
}

export async function getProduct(access: FarmAccess, id: string): Promise<Product> {
	const row = isUuid(id) ? await live(db(), access).where({ id }).first() : undefined;
	if (!row) throw notFound('product');
	return toProduct(row);
}

export async function createProduct(access: FarmAccess, input: ProductInput): Promise<Product> {
	try {
		return await db().transaction(async (trx) => {
			await refuseDuplicate(trx, access, input.name);
			const [row] = await trx('products')
				.insert({ ...rowValues(input), farm_id: access.farm.id, created_by: access.user.id, updated_by: access.user.id })
				.returning('*');
			const product = toProduct(row);
			await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'product', entityId: row.id, action: 'create', after: product });
			return product;
		});
	} catch (e) {
		throw fromUniqueViolation(e, input.name);
	}
}

export async function updateProduct(access: FarmAccess, id: string, patch: ProductPatch): Promise<Product> {
	await getProduct(access, id);
	const { version, ...changes } = patch;
	try {
		return await db().transaction(async (trx) => {
			const current = await live(trx, access).where({ id }).forUpdate().first();
			if (!current) throw notFound('product');
			if (current.version !== version) throw versionConflict('product', current.version, version);
			if (changes.name !== undefined) await refuseDuplicate(trx, access, changes.name, id);
			const [row] = await trx('products')
				.where({ id })
				.update({ ...rowValues(changes), version: current.version + 1, updated_by: access.user.id, updated_at: trx.fn.now() })
				.returning('*');
			const product = toProduct(row);
			await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'product', entityId: id, action: 'update', before: toProduct(current), after: product });
			return product;
		});
	} catch (e) {
		throw fromUniqueViolation(e, changes.name);
	}
}

/** Soft delete: records that used the product keep their copy of its label data. */
export async function deleteProduct(access: FarmAccess, id: string, version?: number): Promise<void> {
	await getProduct(access, id);
	await db().transaction(async (trx) => {
		const current = await live(trx, access).where({ id }).forUpdate().first();
		if (!current) throw notFound('product');
		if (version !== undefined && current.version !== version) throw versionConflict('product', current.version, version);
		await trx('products').where({ id }).update({ deleted_at: trx.fn.now(), deleted_by: access.user.id });
		await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'product', entityId: id, action: 'delete', before: toProduct(current) });
	});
}
