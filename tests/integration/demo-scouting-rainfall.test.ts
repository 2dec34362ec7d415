import { describe, expect, it } from 'vitest';
import sharp from 'sharp';
import { db } from '$lib/server/db';
import { fileStore } from '$lib/server/storage';
import './helpers';

const DEMO_FARM_ID = '5a1e0000-0000-4000-8000-00000000f001';

describe('demo scouting notes and rainfall', () => {
	it('has notes on lanes of the adopted plans, one with a stored photo without metadata', async () => {
		const notes = await db()('scouting_notes').where({ farm_id: DEMO_FARM_ID }).whereNull('deleted_at');
		expect(notes.length).toBeGreaterThanOrEqual(5);
		expect(new Set(notes.map((n) => n.season))).toEqual(new Set([2025, 2026]));
		for (const n of notes) {
			const lane = await db()('plans as p').join('plan_lanes as l', 'l.plan_id', 'p.id').where({ 'p.field_id': n.field_id, 'p.season': n.season, 'p.adopted': true, 'l.lane_index': n.lane_index }).first('l.crop');
			expect(lane?.crop).toBe(n.lane_crop);
		}
		const photos = await db()('attachments').where({ farm_id: DEMO_FARM_ID, entity: 'scouting_note' }).whereNull('deleted_at');
		expect(photos).toHaveLength(1);
		const stored = await fileStore().get(photos[0].storage_key);
		expect(stored).not.toBeNull();
		const meta = await sharp(Buffer.from(stored!)).metadata();
		expect(meta.format).toBe('jpeg');
		expect(meta.exif).toBeUndefined();
	});

	it('has two gauges with invented daily rain for 2024, 2025 and 2026, none after today', async () => {
		const gauges = await db()('rain_gauges').where({ farm_id: DEMO_FARM_ID }).whereNull('deleted_at').orderBy('name');
		expect(gauges.map((g) => g.name)).toEqual(['East gauge', 'North 80 gauge']);
		const years = await db()('rainfall_readings')
			.where({ farm_id: DEMO_FARM_ID })
			.select(db().raw('extract(year from reading_date)::int as year'), db().raw('count(*)::int as n'), db().raw('sum(inches) as total'), db().raw("max(to_char(reading_date, 'YYYY-MM-DD')) as last"))
			.groupBy('year')
			.orderBy('year');
		expect(years.map((y) => y.year)).toEqual([2024, 2025, 2026]);
		const today = new Date().toISOString().slice(0, 10);
		for (const y of years) {
			expect(y.n).toBeGreaterThan(20);
			// A plausible April–October total for southern Minnesota (common practice: roughly 20–40 in).
			expect(y.total / 2).toBeGreaterThan(10);
			expect(y.total / 2).toBeLessThan(45);
			expect(y.last <= today).toBe(true);
		}
	});
});
