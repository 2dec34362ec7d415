// The invented demo scenario, part 5: the farm's product list and seed catalogue, with seed lots.
// Generic names only; registration numbers are invented and belong to no real product.
// Idempotent: fixed ids, insert-if-missing. Later seeds refer to DEMO_PRODUCTS and DEMO_VARIETIES.
import type { Knex } from 'knex';
import { DEMO_FARM_ID, DEMO_PEOPLE } from './01_demo_people';

const productId = (n: number) => `5a1e0000-0000-4000-8000-0000000c${String(n).padStart(4, '0')}`;
const varietyId = (n: number) => `5a1e0000-0000-4000-8000-0000000d${String(n).padStart(4, '0')}`;
const lotId = (n: number) => `5a1e0000-0000-4000-8000-0000000d${String(1000 + n).padStart(4, '0')}`;

export const DEMO_PRODUCTS = {
	residualHerbicideA: productId(1),
	postHerbicideB: productId(2),
	insecticideC: productId(3),
	fungicideD: productId(4),
	uan32: productId(5),
	starter10340: productId(6),
	coverMix: productId(7)
} as const;

export const DEMO_VARIETIES = {
	cornHybridA: varietyId(1),
	cornHybridB: varietyId(2),
	cornHybridC: varietyId(3),
	cornHybridD: varietyId(4),
	cornHybridE: varietyId(5),
	soybeanLineA: varietyId(6),
	soybeanLineB: varietyId(7),
	cerealRye: varietyId(8),
	crimsonClover: varietyId(9)
} as const;

interface DemoProduct {
	id: string;
	name: string;
	kind: 'herbicide' | 'insecticide' | 'fungicide' | 'fertilizer' | 'seed-treatment' | 'other';
	unit: string;
	epa_reg_no?: string;
	active_ingredients?: string;
	restricted_use?: boolean;
	rei_hours?: number;
	phi_days?: number;
	grazing_days?: number;
	formulation?: string;
	analysis?: string;
	pounds_per_gallon?: number;
	notes?: string;
}

export const DEMO_PRODUCT_ROWS: DemoProduct[] = [
	{
		id: DEMO_PRODUCTS.residualHerbicideA, name: 'residual herbicide A', kind: 'herbicide', unit: 'pt', epa_reg_no: '9999-101',
		active_ingredients: 'active ingredient A1 (invented)', restricted_use: true, rei_hours: 24, phi_days: 60, grazing_days: 30,
		formulation: 'emulsifiable concentrate', notes: 'Pre-emergence on corn. Restricted use: certified applicators only.'
	},
	{
		id: DEMO_PRODUCTS.postHerbicideB, name: 'post herbicide B', kind: 'herbicide', unit: 'fl oz', epa_reg_no: '9999-102',
		active_ingredients: 'active ingredient B1 (invented)', rei_hours: 4, phi_days: 45, grazing_days: 14, formulation: 'soluble liquid'
	},
	{
		id: DEMO_PRODUCTS.insecticideC, name: 'insecticide C', kind: 'insecticide', unit: 'fl oz', epa_reg_no: '9999-103-2001',
		active_ingredients: 'active ingredient C1 (invented)', restricted_use: true, rei_hours: 12, phi_days: 21, grazing_days: 7,
		formulation: 'capsule suspension'
	},
	{
		id: DEMO_PRODUCTS.fungicideD, name: 'fungicide D', kind: 'fungicide', unit: 'fl oz', epa_reg_no: '9999-104',
		active_ingredients: 'active ingredient D1 (invented)', rei_hours: 12, phi_days: 7, formulation: 'suspension concentrate'
	},
	{
		// 11.06 lb/gal for 32 % UAN: from memory; check the supplier's sheet.
		id: DEMO_PRODUCTS.uan32, name: 'UAN 32 %', kind: 'fertilizer', unit: 'gal', analysis: '32-0-0', pounds_per_gallon: 11.06,
		formulation: 'liquid solution', notes: 'Side-dress on corn lanes.'
	},
	{
		// 11.65 lb/gal for 10-34-0: from memory; check the supplier's sheet.
		id: DEMO_PRODUCTS.starter10340, name: 'starter 10-34-0', kind: 'fertilizer', unit: 'gal', analysis: '10-34-0', pounds_per_gallon: 11.65,
		formulation: 'liquid solution', notes: 'In furrow at planting.'
	},
	{
		id: DEMO_PRODUCTS.coverMix, name: 'cover mix (rye and clover)', kind: 'other', unit: 'lb',
		notes: 'Cereal rye and crimson clover, seeded between the twin rows.'
	}
];

interface DemoVariety {
	id: string;
	crop: string;
	name: string;
	relative_maturity?: number;
	seeds_per_unit?: number;
	traits?: string;
	lots: { n: number; lot_number: string; germination_pct: number; treatment: string; units_on_hand?: number }[];
}

// Corn units of 80,000 seeds and soybean units of 140,000 seeds: common practice.
export const DEMO_VARIETY_ROWS: DemoVariety[] = [
	{ id: DEMO_VARIETIES.cornHybridA, crop: 'corn', name: 'hybrid A (105-day)', relative_maturity: 105, seeds_per_unit: 80_000, traits: 'glyphosate tolerant; above-ground insect protection',
		lots: [{ n: 1, lot_number: 'HA-2026-014', germination_pct: 95, treatment: 'fungicide + insecticide seed treatment', units_on_hand: 42 }] },
	{ id: DEMO_VARIETIES.cornHybridB, crop: 'corn', name: 'hybrid B', relative_maturity: 98, seeds_per_unit: 80_000, traits: 'conventional (no traits)',
		lots: [{ n: 2, lot_number: 'HB-2026-003', germination_pct: 94, treatment: 'fungicide seed treatment' }] },
	{ id: DEMO_VARIETIES.cornHybridC, crop: 'corn', name: 'hybrid C (102-day)', relative_maturity: 102, seeds_per_unit: 80_000, traits: 'glyphosate tolerant',
		lots: [{ n: 3, lot_number: 'HC-2026-021', germination_pct: 96, treatment: 'fungicide + insecticide seed treatment' }] },
	{ id: DEMO_VARIETIES.cornHybridD, crop: 'corn', name: 'hybrid D', relative_maturity: 100, seeds_per_unit: 80_000, lots: [] },
	{ id: DEMO_VARIETIES.cornHybridE, crop: 'corn', name: 'hybrid E', relative_maturity: 95, seeds_per_unit: 80_000, lots: [] },
	{ id: DEMO_VARIETIES.soybeanLineA, crop: 'soybean', name: 'soybean line 2.1', relative_maturity: 2.1, seeds_per_unit: 140_000, traits: 'glyphosate tolerant',
		lots: [{ n: 4, lot_number: 'SL21-2026-007', germination_pct: 90, treatment: 'fungicide seed treatment + inoculant', units_on_hand: 60 }] },
	{ id: DEMO_VARIETIES.soybeanLineB, crop: 'soybean', name: 'soybean line 1.8', relative_maturity: 1.8, seeds_per_unit: 140_000, traits: 'conventional (no traits)',
		lots: [{ n: 5, lot_number: 'SL18-2026-002', germination_pct: 88, treatment: 'untreated' }] },
	{ id: DEMO_VARIETIES.cerealRye, crop: 'cereal rye', name: 'cereal rye (variety not stated)', lots: [{ n: 6, lot_number: 'RYE-2026-1', germination_pct: 85, treatment: 'untreated' }] },
	{ id: DEMO_VARIETIES.crimsonClover, crop: 'crimson clover', name: 'crimson clover (variety not stated)', lots: [{ n: 7, lot_number: 'CC-2026-1', germination_pct: 80, treatment: 'inoculated' }] }
];

export async function seed(knex: Knex) {
	const owner = DEMO_PEOPLE[0].id;
	const stamp = { created_by: owner, updated_by: owner };
	for (const { id, ...p } of DEMO_PRODUCT_ROWS) {
		await knex('products').insert({ id, farm_id: DEMO_FARM_ID, restricted_use: false, ...p, ...stamp }).onConflict('id').ignore();
	}
	for (const { id, lots, ...v } of DEMO_VARIETY_ROWS) {
		await knex('varieties').insert({ id, farm_id: DEMO_FARM_ID, ...v, ...stamp }).onConflict('id').ignore();
		for (const { n, ...lot } of lots) {
			await knex('seed_lots').insert({ id: lotId(n), farm_id: DEMO_FARM_ID, variety_id: id, ...lot, ...stamp }).onConflict('id').ignore();
		}
	}
}
