// The invented demo scenario, part 4: the farm's equipment, set up so the checks have something
// to find (a misplumbed row unit, a drill wider than the pasture lanes). Idempotent: fixed ids.
import type { Knex } from 'knex';
import type { PlanterSetup } from '../src/lib/equipment/types';
import { DEMO_FARM_ID, DEMO_PEOPLE } from './01_demo_people';

const id = (n: number) => `5a1e0000-0000-4000-8000-0000000e${String(n).padStart(4, '0')}`;
export const DEMO_PLANTER_ID = id(1);

// The density is the farm's own entry from its supplier's label (invented, like all demo data).
const nitrogen = { id: 'n', name: 'Nitrogen (UAN 32 %)', product: 'UAN 32 %', forCrops: ['corn'], gallonsPerAcre: 15, poundsPerGallon: 11.06, percentN: 32 };
const starter = { id: 'starter', name: 'Starter 10-34-0', product: 'starter 10-34-0', forCrops: ['corn', 'soybean'], gallonsPerAcre: 5, poundsPerGallon: 11.65, percentN: 10 };

const splitPlanter: PlanterSetup = {
	rowSpacingIn: 30,
	fertilizerLines: [nitrogen, starter],
	rowUnits: Array.from({ length: 16 }, (_, i) => {
		const unit = i + 1;
		const corn = unit <= 8;
		// Unit 9's nitrogen valve was left open after last season: the sheet must catch it.
		const fertilizerOn = corn || unit === 9 ? ['n', 'starter'] : ['starter'];
		return { unit, seed: corn ? { crop: 'corn', variety: 'hybrid A (105-day)' } : { crop: 'soybean', variety: 'soybean line 2.1' }, fertilizerOn };
	})
};

const sidedressBar: PlanterSetup = {
	rowSpacingIn: 30,
	fertilizerLines: [{ ...nitrogen, gallonsPerAcre: 20 }],
	rowUnits: Array.from({ length: 8 }, (_, i) => ({ unit: i + 1, seed: null, fertilizerOn: ['n'] }))
};

const equipment = [
	{ id: DEMO_PLANTER_ID, name: '16-row split planter', kind: 'planter', working_width_ft: 40, planter: splitPlanter, rows: 16, is_default_planter: true, notes: 'Units 1–8 corn, 9–16 soybean; nitrogen and starter on the corn side.' },
	{ id: id(2), name: '15-ft drill', kind: 'drill', working_width_ft: 15, notes: 'Cover mix and small grains.' },
	{ id: id(3), name: '60-ft sprayer', kind: 'sprayer', working_width_ft: 60, sections: 6 },
	{ id: id(4), name: '8-row side-dress bar', kind: 'sidedress', working_width_ft: 20, planter: sidedressBar, rows: 8 },
	{ id: id(5), name: '8-row corn head', kind: 'combine_head', working_width_ft: 20, rows: 8 },
	{ id: id(6), name: 'Ewe shelter', kind: 'shelter', working_width_ft: 10, length_ft: 24, notes: 'Moves daily along the pasture lanes.' },
	{ id: id(7), name: 'Pig shelter', kind: 'shelter', working_width_ft: 8, length_ft: 16 }
];

export async function seed(knex: Knex) {
	for (const e of equipment) {
		const row = { farm_id: DEMO_FARM_ID, created_by: DEMO_PEOPLE[0].id, ...e, planter: 'planter' in e && e.planter ? JSON.stringify(e.planter) : null };
		await knex('equipment').insert(row).onConflict('id').ignore();
	}
}
