// The winter planning board: every field's state for the coming season, and "plan next season
// for every field", which creates only the plans that are missing and changes no existing one.
import { db } from './db';
import type { FarmAccess } from './access';
import { AppError } from './errors';
import { choosePlanter, listEquipment } from './equipment';
import { getPlan, planNextSeason } from './plans';
import { visibleFields } from './farm-season';
import { planterCheckSummary, type PlanterCheckSummary } from '../farm/planter-check';
import { sumRotations } from '../farm/rotation';
import { compactNumbers } from '../farm/condense';
import type { RotationCell } from '../geometry/rotation';

export type BoardState = 'no_plan' | 'draft' | 'adopted';

export interface BoardRow {
	fieldId: string;
	name: string;
	acres: number;
	state: BoardState;
	/** Variants of the season that are not adopted. */
	drafts: string[];
	plantedAcres: number | null;
	/** The season before has an adopted plan to shift from. */
	canShift: boolean;
	/** The default planter against the adopted plan; null without either. */
	planterCheck: PlanterCheckSummary | null;
	/** The latest time the cab sheet was sent or printed, as the audit log recorded it. */
	sheet: { action: string; at: Date } | null;
	/** Planting records of the season, from the record book. */
	planting: { records: number; acres: number; lastAt: Date } | null;
}

export interface PlanningBoard {
	season: number;
	planter: { id: string; name: string } | null;
	rows: BoardRow[];
}

/** One row per visible field for the season, with what stands and what is left to do. */
export async function planningBoard(access: FarmAccess, season: number): Promise<PlanningBoard> {
	const fields = await visibleFields(access);
	const ids = fields.map((f) => f.id);
	const equipment = access.sees.equipment ? await listEquipment(access) : [];
	const planter = choosePlanter(equipment);
	if (ids.length === 0) return { season, planter: planter ? { id: planter.id, name: planter.name } : null, rows: [] };

	const [plans, previous, sheets, planting] = await Promise.all([
		db()('plans').where({ farm_id: access.farm.id, season }).whereNull('deleted_at').whereIn('field_id', ids).orderBy('variant').select('field_id', 'variant', 'adopted', 'planted_acres'),
		db()('plans').where({ farm_id: access.farm.id, season: season - 1, adopted: true }).whereNull('deleted_at').whereIn('field_id', ids).select('field_id'),
		db()('audit_log')
			.where({ farm_id: access.farm.id, entity: 'sheet' })
			.whereIn('entity_id', ids)
			.whereRaw("(after->>'season') = ?", [String(season)])
			.orderBy([{ column: 'at', order: 'desc' }, { column: 'id', order: 'desc' }])
			.select('entity_id', 'action', 'at'),
		db()('operations')
			.where({ farm_id: access.farm.id, season })
			.whereIn('type', ['planting', 'replant'])
			.whereNull('deleted_at')
			.whereIn('field_id', ids)
			.groupBy('field_id')
			.select('field_id')
			.count({ records: '*' })
			.sum({ acres: 'acres' })
			.max({ last_at: 'ended_at' })
	]);
	const shiftable = new Set(previous.map((p) => p.field_id));

	const rows: BoardRow[] = [];
	for (const f of fields) {
		const mine = plans.filter((p) => p.field_id === f.id);
		const adopted = mine.find((p) => p.adopted);
		let planterCheck: PlanterCheckSummary | null = null;
		if (adopted && planter?.planter) {
			const plan = await getPlan(access, f.id, season);
			planterCheck = plan.lanes.length ? planterCheckSummary(plan.lanes, plan.pattern, planter.planter) : { ok: false, stops: 1, warnings: 0, kinds: [], error: 'The plan has no lanes inside the planted area.' };
		}
		const sheet = sheets.find((s) => s.entity_id === f.id);
		// eslint-disable-next-line @typescript-eslint/no-explicit-any
		const planted = (planting as any[]).find((p) => p.field_id === f.id);
		rows.push({
			fieldId: f.id,
			name: f.name,
			acres: f.acres,
			state: adopted ? 'adopted' : mine.length ? 'draft' : 'no_plan',
			drafts: mine.filter((p) => !p.adopted).map((p) => p.variant),
			plantedAcres: adopted ? Number(adopted.planted_acres) : null,
			canShift: shiftable.has(f.id),
			planterCheck,
			sheet: sheet ? { action: sheet.action, at: new Date(sheet.at) } : null,
			planting: planted ? { records: Number(planted.records), acres: Number(planted.acres), lastAt: new Date(planted.last_at) } : null
		});
	}
	return { season, planter: planter ? { id: planter.id, name: planter.name } : null, rows };
}

export interface BatchFlag {
	fieldId: string;
	fieldName: string;
	kind: 'same_crop' | 'corn_borders_corn';
	message: string;
}

export interface BatchResult {
	season: number;
	created: { fieldId: string; name: string; lanes: number; plantedAcres: number; shift: string }[];
	skipped: { fieldId: string; name: string; reason: string }[];
	rotation: RotationCell[];
	/** One line per field and kind of flag, lanes listed compactly. */
	flags: BatchFlag[];
}

/**
 * Creates next season's plan, by the usual shift from the season before, for every visible field
 * that has no plan of that season at all (any variant). A field that already has one is left as
 * it is, adoption included. The new plan is the season's only plan, so it is the adopted one, as
 * when one field is planned ahead by hand.
 */
export async function planEveryMissingField(access: FarmAccess, season: number): Promise<BatchResult> {
	const fields = await visibleFields(access);
	const ids = fields.map((f) => f.id);
	const existing = new Set(
		ids.length ? (await db()('plans').where({ farm_id: access.farm.id, season }).whereNull('deleted_at').whereIn('field_id', ids).distinct('field_id')).map((r) => r.field_id) : []
	);
	const result: BatchResult = { season, created: [], skipped: [], rotation: [], flags: [] };
	const matrices: RotationCell[][] = [];
	for (const f of fields) {
		if (existing.has(f.id)) {
			result.skipped.push({ fieldId: f.id, name: f.name, reason: `already has a ${season} plan; left as it is` });
			continue;
		}
		try {
			const next = await planNextSeason(access, f.id, season - 1, { shift: 'default' });
			result.created.push({ fieldId: f.id, name: f.name, lanes: next.plan.lanes.length, plantedAcres: next.plan.plantedAcres, shift: next.shiftDescription });
			matrices.push(next.rotation);
			const cornEdge = next.warnings.filter((w) => w.kind === 'corn_borders_corn' && w.laneIndex !== null).map((w) => (w.laneIndex as number) + 1);
			for (const w of next.warnings.filter((x) => x.kind === 'same_crop')) result.flags.push({ fieldId: f.id, fieldName: f.name, kind: 'same_crop', message: w.message });
			if (cornEdge.length) {
				result.flags.push({
					fieldId: f.id,
					fieldName: f.name,
					kind: 'corn_borders_corn',
					message: `${cornEdge.length} corn lane${cornEdge.length === 1 ? '' : 's'} (${compactNumbers(cornEdge)}) border last season's corn: scout ${cornEdge.length === 1 ? 'its' : 'their'} edge rows for rootworm.`
				});
			}
		} catch (e) {
			if (!(e instanceof AppError)) throw e;
			const reason =
				e.code === 'already_planned'
					? `someone planned ${season} a moment ago; left as it is`
					: e.status === 404
						? `no adopted ${season - 1} plan to shift from`
						: e.message;
			result.skipped.push({ fieldId: f.id, name: f.name, reason });
		}
	}
	result.rotation = sumRotations(matrices);
	return result;
}
