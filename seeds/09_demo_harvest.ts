// The invented demo scenario, part 9: harvest of the two past seasons on every demo field — weighed
// loads per lane, outside and inside rows apart on some lanes (soybean border rows yield less, outside
// corn rows more), the hybrid comparison block and the 30-in check strips beside the wide rows.
// Numbers are invented, shaped like the published ranges (border-row and wide-row trials), not data.
import type { Knex } from 'knex';
import { harvestFigures, type HarvestLane, type RowPosition } from '../src/lib/harvest/entry';
import { GRAIN_STANDARDS, type GrainCrop } from '../src/lib/agronomy/index';
import { DEMO_FARM_ID, DEMO_PEOPLE } from './01_demo_people';
import { DEMO_FIELDS } from './02_demo_fields';

const SEASONS = [2025, 2026] as const;

/** Repeatable scatter in −1…1 from a lane and season, so every seeding gives the same numbers. */
const scatter = (a: number, b: number) => {
	const x = Math.sin(a * 12.9898 + b * 78.233) * 43_758.5453;
	return (x - Math.floor(x)) * 2 - 1;
};

interface LaneRow extends HarvestLane {
	widthFt: number;
	variety: string | null;
	trialLabel: string | null;
	geometry: unknown;
}

/** Inside-row (or whole-lane, for lanes without border rows) yield of a lane, bu/ac. */
function baseYield(fieldId: string, season: number, lane: LaneRow): number {
	const year = season === 2025 ? 1 : 0.96; // a drier second summer
	const noise = scatter(lane.laneIndex, season);
	if (lane.crop === 'soybean') return (58 + 3 * noise) * year;
	if (fieldId === DEMO_FIELDS.wideRow) {
		const spacing = (lane.widthFt * 12) / lane.rows;
		const bySpacing = spacing <= 30 ? 208 : spacing <= 60 ? 176 : spacing <= 72 ? 168 : 151;
		return (bySpacing + 5 * noise) * year;
	}
	const hybrid: Record<string, number> = { 'hybrid A': 200, 'hybrid B': 209, 'hybrid D': 195, 'hybrid E': 213 };
	return ((lane.variety && hybrid[lane.variety]) || 198 + 6 * noise) * year;
}

/** Outside rows beside another crop: corn gains, soybean loses (southern Minnesota strip trials, 1990s). */
const EDGE = { corn: 1.14, soybean: 0.86 } as Record<string, number>;

const MOISTURE: Record<string, number> = { corn: 19.5, soybean: 12.0 };

export async function seed(knex: Knex) {
	const existing = await knex('harvest_entries').where({ farm_id: DEMO_FARM_ID }).first('id');
	if (existing) return;
	const owner = DEMO_PEOPLE[0].id;
	const crew = DEMO_PEOPLE[2].id;
	for (const fieldId of Object.values(DEMO_FIELDS)) {
		for (const season of SEASONS) {
			const plan = await knex('plans').where({ farm_id: DEMO_FARM_ID, field_id: fieldId, season, adopted: true }).whereNull('deleted_at').first('id', 'version');
			if (!plan) continue;
			const lanes: LaneRow[] = (await knex('plan_lanes').where({ plan_id: plan.id }).orderBy('lane_index')).map((r) => ({
				laneIndex: r.lane_index, kind: r.kind, crop: r.crop, acres: Number(r.acres), rows: r.rows, borderRows: r.border_rows,
				widthFt: Number(r.width_ft), variety: r.variety, trialLabel: r.trial_label, geometry: r.geometry
			}));
			let cropLane = 0;
			for (const lane of lanes) {
				if (lane.kind !== 'crop' || !(lane.crop in GRAIN_STANDARDS) || lane.acres < 0.05) continue;
				cropLane++;
				const crop = lane.crop as GrainCrop;
				const inside = baseYield(fieldId, season, lane);
				// Trial blocks are weighed whole, so hybrids compare like with like; elsewhere every third lane has its rows apart.
				const splitRows = !lane.trialLabel && lane.borderRows > 0 && lane.borderRows < lane.rows && cropLane % 3 === 1;
				const loads: { position: RowPosition; buAc: number; share: number }[] = splitRows
					? [
						{ position: 'outside', buAc: inside * (EDGE[crop] ?? 1) * (1 + 0.02 * scatter(lane.laneIndex + 7, season)), share: lane.borderRows / lane.rows },
						{ position: 'inside', buAc: inside, share: (lane.rows - lane.borderRows) / lane.rows }
					]
					: [{ position: 'all', buAc: (inside * (lane.rows - lane.borderRows) + inside * (EDGE[crop] ?? 1) * lane.borderRows) / lane.rows, share: 1 }];
				for (const load of loads) {
					const standard = GRAIN_STANDARDS[crop];
					const moisture = Number((MOISTURE[crop] + 1.5 * scatter(lane.laneIndex, season + 1)).toFixed(1));
					// Weighed wet weight that gives the intended yield at standard moisture.
					const wetWeightLb = Math.round((load.buAc * lane.acres * load.share * standard.poundsPerBushel * (100 - standard.standardMoisturePct)) / (100 - moisture));
					const input = { crop, wetWeightLb, moisturePct: moisture, rowPosition: load.position };
					const f = harvestFigures(input, [lane]);
					const [row] = await knex('harvest_entries').insert({
						farm_id: DEMO_FARM_ID, field_id: fieldId, season, plan_id: plan.id, plan_version: plan.version, crop, row_position: load.position,
						harvested_on: `${season}-${crop === 'soybean' ? '10-02' : '10-21'}`, wet_weight_lb: wetWeightLb, moisture_pct: moisture,
						harvested_acres: f.harvestedAcres, standard_moisture_pct: f.standardMoisturePct, pounds_per_bushel: f.poundsPerBushel,
						bushels: f.bushels, bushels_per_acre: f.bushelsPerAcre, notes: lane.trialLabel ? `${lane.trialLabel} (demo)` : null,
						created_by: cropLane % 2 ? crew : owner, updated_by: cropLane % 2 ? crew : owner
					}).returning('id');
					await knex('harvest_entry_lanes').insert({
						farm_id: DEMO_FARM_ID, entry_id: row.id, lane_index: lane.laneIndex, kind: lane.kind, crop: lane.crop, lane_acres: lane.acres,
						width_ft: lane.widthFt, rows: lane.rows, border_rows: lane.borderRows, variety: lane.variety, trial_label: lane.trialLabel,
						geometry: JSON.stringify(lane.geometry)
					});
				}
			}
		}
	}
}
