import type { Knex } from 'knex';
import { layoutStrips } from '../src/lib/geometry/index';
import { summariseByCrop } from '../src/lib/geometry/totals';
import type { Lane } from '../src/lib/geometry/types';

// A saved plan is read back exactly as it was laid out, never laid out again on read: the plan
// keeps its layout totals beside its lanes, and measured values keep every digit they were
// saved with (unscaled numeric), so a past season reads the same whatever the geometry code does.

const PLAN_NUMBERS = ['field_acres', 'planted_acres'];
const LANE_NUMBERS = ['width_ft', 'offset_ft', 'acres', 'row_feet'];

export async function up(knex: Knex) {
	await knex.raw(`ALTER TABLE plans ${PLAN_NUMBERS.map((c) => `ALTER COLUMN ${c} TYPE numeric`).join(', ')}`);
	await knex.raw(`ALTER TABLE plan_lanes ${LANE_NUMBERS.map((c) => `ALTER COLUMN ${c} TYPE numeric`).join(', ')}`);
	await knex.schema.alterTable('plans', (t) => {
		t.decimal('headland_acres', null);
		t.decimal('excluded_acres', null);
		t.jsonb('by_crop');
	});
	await backfill(knex);
	await knex.raw('ALTER TABLE plans ALTER COLUMN headland_acres SET NOT NULL, ALTER COLUMN excluded_acres SET NOT NULL, ALTER COLUMN by_crop SET NOT NULL');
}

/**
 * Plans saved before this migration: crop totals are summed from their stored lanes; headland and
 * excluded acres were never stored, so they are laid out once here, on the outline the plan used.
 */
async function backfill(knex: Knex) {
	const plans = await knex('plans as p')
		.join('field_boundary_versions as v', function () {
			this.on('v.field_id', 'p.field_id').andOn('v.version', 'p.boundary_version');
		})
		.select('p.id', 'p.guidance', 'p.pattern', 'p.offset_ft', 'p.headland_ft', 'p.field_acres', 'p.planted_acres', 'v.boundary', 'v.exclusions', 'v.excluded_acres');
	for (const p of plans) {
		const rows = await knex('plan_lanes').where({ plan_id: p.id }).orderBy('lane_index');
		const lanes = rows.map((r) => ({ crop: r.crop, acres: Number(r.acres), rows: r.rows, rowFeet: Number(r.row_feet), borderRows: r.border_rows })) as Lane[];
		let headlandAcres: number;
		let excludedAcres: number;
		try {
			const layout = layoutStrips({
				boundary: p.boundary,
				exclusions: (p.exclusions ?? []).map((x: { geometry: unknown }) => x.geometry),
				guidance: p.guidance,
				pattern: p.pattern,
				offsetFt: Number(p.offset_ft),
				headlandFt: Number(p.headland_ft)
			});
			headlandAcres = layout.headlandAcres;
			excludedAcres = layout.excludedAcres;
		} catch {
			// An outline today's code refuses: what is not planted and not excluded was headland.
			excludedAcres = Number(p.excluded_acres);
			headlandAcres = Math.max(0, Number(p.field_acres) - Number(p.planted_acres) - excludedAcres);
		}
		await knex('plans').where({ id: p.id }).update({ headland_acres: headlandAcres, excluded_acres: excludedAcres, by_crop: JSON.stringify(summariseByCrop(lanes)) });
	}
}

export async function down(knex: Knex) {
	await knex.schema.alterTable('plans', (t) => {
		t.dropColumn('headland_acres');
		t.dropColumn('excluded_acres');
		t.dropColumn('by_crop');
	});
	await knex.raw('ALTER TABLE plans ALTER COLUMN field_acres TYPE numeric(12, 4), ALTER COLUMN planted_acres TYPE numeric(12, 4)');
	await knex.raw('ALTER TABLE plan_lanes ALTER COLUMN width_ft TYPE numeric(10, 4), ALTER COLUMN offset_ft TYPE numeric(12, 4), ALTER COLUMN acres TYPE numeric(12, 6), ALTER COLUMN row_feet TYPE numeric(14, 2)');
}
