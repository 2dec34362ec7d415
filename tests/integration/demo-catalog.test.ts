// The invented demo as seeded: every plan lane's variety comes from the farm's own seed catalogue
// and is a variety of that lane's crop, in every season and variant.
import { describe, expect, it } from 'vitest';
import { db } from '$lib/server/db';
import { DEMO_PRODUCTS, DEMO_VARIETIES } from '../../seeds/05_demo_catalog';
import './helpers';

const DEMO_FARM_ID = '5a1e0000-0000-4000-8000-00000000f001';

describe('demo catalogue', () => {
	it('gives every assigned lane of every demo plan a catalogue variety of the lane crop', async () => {
		const lanes = await db()('plan_lanes as l')
			.join('plans as p', 'p.id', 'l.plan_id')
			.join('fields as f', 'f.id', 'p.field_id')
			.leftJoin('varieties as v', function () {
				this.on('v.farm_id', 'l.farm_id').andOn(db().raw('lower(v.name) = lower(l.variety)')).andOnNull('v.deleted_at');
			})
			.where('l.farm_id', DEMO_FARM_ID)
			.whereNull('p.deleted_at')
			.whereNotNull('l.variety')
			.select('f.name as field', 'p.season', 'p.variant', 'l.lane_index', 'l.crop', 'l.variety', 'v.crop as varietyCrop');
		expect(lanes.length).toBeGreaterThan(50);
		const wrong = lanes
			.filter((l) => l.varietyCrop !== l.crop)
			.map((l) => `${l.field} ${l.season} ${l.variant} lane ${l.lane_index + 1}: ${l.crop} lane given "${l.variety}" (${l.varietyCrop ?? 'not in the catalogue'})`);
		expect(wrong).toEqual([]);
		const seasons = new Set(lanes.map((l) => l.season));
		expect([...seasons].sort()).toEqual([2025, 2026, 2027]);
	});

	it('has both crops on the 2026 north field, each with its own seed unit', async () => {
		const rows = await db()('plan_lanes as l')
			.join('plans as p', 'p.id', 'l.plan_id')
			.join('fields as f', 'f.id', 'p.field_id')
			.join('varieties as v', function () {
				this.on('v.farm_id', 'l.farm_id').andOn(db().raw('lower(v.name) = lower(l.variety)'));
			})
			.where({ 'l.farm_id': DEMO_FARM_ID, 'p.season': 2026, 'p.adopted': true, 'f.name': 'North 80' })
			.distinct('l.crop', 'v.name', 'v.seeds_per_unit')
			.orderBy('l.crop');
		expect(rows).toEqual([
			{ crop: 'corn', name: 'hybrid A (105-day)', seeds_per_unit: 80_000 },
			{ crop: 'soybean', name: 'soybean line 2.1', seeds_per_unit: 140_000 }
		]);
	});

	it('holds the named products with their label data, under fixed ids', async () => {
		const rows = await db()('products').whereIn('id', Object.values(DEMO_PRODUCTS)).where({ farm_id: DEMO_FARM_ID });
		expect(rows).toHaveLength(Object.keys(DEMO_PRODUCTS).length);
		const a = rows.find((r) => r.id === DEMO_PRODUCTS.residualHerbicideA);
		expect([a.name, a.kind, a.restricted_use, Number(a.rei_hours), a.phi_days, a.grazing_days]).toEqual(['residual herbicide A', 'herbicide', true, 24, 60, 30]);
		const c = rows.find((r) => r.id === DEMO_PRODUCTS.insecticideC);
		expect([c.kind, c.restricted_use]).toEqual(['insecticide', true]);
		const uan = rows.find((r) => r.id === DEMO_PRODUCTS.uan32);
		expect([uan.name, uan.kind, uan.analysis, Number(uan.pounds_per_gallon)]).toEqual(['UAN 32 %', 'fertilizer', '32-0-0', 11.06]);
		expect(rows.find((r) => r.id === DEMO_PRODUCTS.coverMix).kind).toBe('other');
	});

	it('holds the named varieties and their lots', async () => {
		const rows = await db()('varieties').whereIn('id', Object.values(DEMO_VARIETIES)).where({ farm_id: DEMO_FARM_ID }).orderBy('name');
		expect(rows).toHaveLength(Object.keys(DEMO_VARIETIES).length);
		const byId = new Map(rows.map((r) => [r.id, r]));
		expect(byId.get(DEMO_VARIETIES.cornHybridA).crop).toBe('corn');
		expect(byId.get(DEMO_VARIETIES.soybeanLineB).crop).toBe('soybean');
		for (const r of rows.filter((x) => x.crop === 'corn')) {
			expect(Number(r.relative_maturity)).toBeGreaterThanOrEqual(95);
			expect(Number(r.relative_maturity)).toBeLessThanOrEqual(105);
			expect(r.seeds_per_unit).toBe(80_000);
		}
		const lot = await db()('seed_lots').where({ variety_id: DEMO_VARIETIES.cornHybridA }).first();
		expect([lot.lot_number, Number(lot.germination_pct)]).toEqual(['HA-2026-014', 95]);
	});
});
