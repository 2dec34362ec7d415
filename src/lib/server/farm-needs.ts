// Seed and fertilizer the farm needs for a season, from the adopted plans as stored: seed from each
// lane's variety and population, fertilizer from the default planter's lines and entered rates.
import { db } from './db';
import type { FarmAccess } from './access';
import { visibleFields } from './farm-season';
import { choosePlanter, listEquipment } from './equipment';
import { getPlan } from './plans';
import { EquipmentError, seedAndFertilizerQuantities, type LineRate } from '../equipment/index';
import { fertilizerNeeds, seedNeeds, type FertilizerNeed, type FieldFertilizer, type SeedNeed, type UnratedSeed } from '../farm/needs';

export interface FarmNeeds {
	season: number;
	fieldsPlanned: number;
	fieldsWithoutPlan: string[];
	seed: SeedNeed[];
	unrated: UnratedSeed[];
	fertilizer: FertilizerNeed[];
	planter: string | null;
	notes: string[];
}

export async function farmNeeds(access: FarmAccess, season: number): Promise<FarmNeeds> {
	const fields = await visibleFields(access);
	const ids = fields.map((f) => f.id);
	const notes: string[] = [];
	if (ids.length === 0) return { season, fieldsPlanned: 0, fieldsWithoutPlan: [], seed: [], unrated: [], fertilizer: [], planter: null, notes };

	const [lanes, catalogue] = await Promise.all([
		db()('plan_lanes as l')
			.join('plans as p', 'p.id', 'l.plan_id')
			.where({ 'p.farm_id': access.farm.id, 'p.season': season, 'p.adopted': true, 'l.farm_id': access.farm.id })
			.whereNull('p.deleted_at')
			.whereIn('p.field_id', ids)
			.select('p.field_id', 'l.crop', 'l.kind', 'l.variety', 'l.acres', 'l.population_per_acre'),
		db()('varieties').where({ farm_id: access.farm.id }).whereNull('deleted_at').select('crop', 'name', 'seeds_per_unit')
	]);
	const planned = new Set(lanes.map((l) => l.field_id));
	const { seed, unrated } = seedNeeds(
		lanes.map((l) => ({ fieldId: l.field_id, crop: l.crop, kind: l.kind, variety: l.variety, acres: Number(l.acres), populationPerAcre: l.population_per_acre === null ? null : Number(l.population_per_acre) })),
		catalogue.map((v) => ({ crop: v.crop, name: v.name, seedsPerUnit: v.seeds_per_unit === null ? null : Number(v.seeds_per_unit) }))
	);

	// Fertilizer rates live on the planter's lines; without a planter there is nothing to total.
	const planter = access.sees.equipment ? choosePlanter(await listEquipment(access)) : null;
	const lines: FieldFertilizer[] = [];
	if (planter?.planter) {
		const setup = planter.planter;
		const rates: Record<string, LineRate> = {};
		for (const line of setup.fertilizerLines) {
			if (!line.gallonsPerAcre) continue;
			rates[line.id] = {
				gallonsPerAcre: line.gallonsPerAcre,
				...(line.percentN && line.poundsPerGallon ? { product: { name: line.product ?? line.name, percentN: line.percentN, poundsPerGallon: line.poundsPerGallon } } : {})
			};
		}
		if (Object.keys(rates).length === 0 && setup.fertilizerLines.length) notes.push(`${planter.name} has fertilizer lines but no rates entered; enter gal/ac on the planter to total fertilizer.`);
		if (Object.keys(rates).length) {
			for (const f of fields.filter((x) => planned.has(x.id))) {
				const plan = await getPlan(access, f.id, season);
				try {
					const q = seedAndFertilizerQuantities(plan.lanes, plan.assignments, setup, { rates });
					for (const l of q.fertilizer) lines.push({ fieldId: f.id, product: l.product, lineName: l.lineName, gallonsPerAcre: l.gallonsPerAcre, acres: l.acres, gallons: l.gallons, poundsN: l.poundsN });
				} catch (e) {
					if (!(e instanceof EquipmentError)) throw e;
					notes.push(`${f.name}: fertilizer left out (${e.message})`);
				}
			}
		}
	} else if (access.sees.equipment) {
		notes.push('No default planter: fertilizer totals come from the planter’s fertilizer lines and their entered rates.');
	}
	return {
		season,
		fieldsPlanned: planned.size,
		fieldsWithoutPlan: fields.filter((f) => !planned.has(f.id)).map((f) => f.name),
		seed,
		unrated,
		fertilizer: fertilizerNeeds(lines),
		planter: planter?.name ?? null,
		notes
	};
}
