import { describe, expect, it } from 'vitest';
import { blocksDuring, laneBlocks } from '../../src/lib/livestock/blocks';
import { laneExtent, stretchOutline } from '../../src/lib/livestock/stretch';
import { geodesicAcres } from '../../src/lib/geometry/index';
import { rectangle } from '../fixtures/rectangle';

const TZ = 'America/Chicago';
const t = (iso: string) => new Date(iso);

describe('blocked dates on pasture lanes', () => {
	it('a label grazing interval runs to the same local time that many calendar days after the end', () => {
		// Worked (common practice, as in NPIC's guidance that the label sets the interval):
		// applied 1 July, 14-day grazing interval → grazing from 15 July, same clock time.
		const blocks = laneBlocks([1], [{ laneIndex: 1, productName: 'residual herbicide A', startedAt: t('2026-07-01T14:00:00Z'), endedAt: t('2026-07-01T16:00:00Z'), grazingDays: 14 }], [], [], TZ);
		expect(blocks).toEqual([
			{ laneIndex: 1, reason: 'grazing-interval', startsAt: '2026-07-01T14:00:00.000Z', endsAt: '2026-07-15T16:00:00.000Z', cause: 'residual herbicide A: grazing interval of 14 days on the label' }
		]);
		expect(blocksDuring(blocks, 1, t('2026-07-15T05:00:00Z'), t('2026-07-16T05:00:00Z'))).toHaveLength(1);
		expect(blocksDuring(blocks, 1, t('2026-07-15T16:00:00Z'), t('2026-07-16T05:00:00Z'))).toHaveLength(0);
		expect(blocksDuring(blocks, 2, t('2026-07-05T05:00:00Z'), t('2026-07-06T05:00:00Z'))).toHaveLength(0);
	});

	it('spraying on lane ±1 closes the lane for 24 h after it ends; lanes further away stay open', () => {
		const spraying = [{ laneIndex: 4, startedAt: t('2026-06-10T13:00:00Z'), endedAt: t('2026-06-10T15:00:00Z') }];
		const blocks = laneBlocks([2, 3, 5, 6], [], spraying, [], TZ);
		expect(blocks.map((b) => [b.laneIndex, b.reason, b.endsAt])).toEqual([
			[3, 'neighbour-spraying', '2026-06-11T15:00:00.000Z'],
			[5, 'neighbour-spraying', '2026-06-11T15:00:00.000Z']
		]);
		expect(blocks[0].cause).toBe('spraying on lane 5 next to it (closed until 24 h after the spraying ended)');
	});

	it('harvest of the lane blocks that day; products without a grazing interval block nothing', () => {
		const blocks = laneBlocks(
			[0],
			[{ laneIndex: 0, productName: 'UAN 32 %', startedAt: t('2026-06-01T12:00:00Z'), endedAt: t('2026-06-01T13:00:00Z'), grazingDays: null }],
			[],
			[{ laneIndex: 0, startsAt: t('2026-09-20T05:00:00Z'), endsAt: t('2026-09-21T05:00:00Z') }],
			TZ
		);
		expect(blocks.map((b) => b.reason)).toEqual(['harvest']);
	});
});

describe('stretches of a lane', () => {
	it('cuts a lane by distance along the A-B direction, with the geodesic area of the cut', () => {
		// A 10 × 1,000 ft lane running north; the A-B line up its west edge.
		const lane = rectangle(10, 1000, -94.2, 43.9);
		const [sw, , , nw] = lane.coordinates[0] as [number, number][];
		const guidance = { a: sw, b: nw };
		const extent = laneExtent(lane, guidance);
		expect(extent.startFt).toBeCloseTo(0, 1);
		expect(extent.lengthFt).toBeCloseTo(1000, 0);
		const whole = geodesicAcres(lane);
		const quarter = stretchOutline(lane, guidance, 250, 500);
		// 10 × 250 ft = 2,500 sq ft = 0.0574 ac: a quarter of the lane, within 0.5 %.
		expect(quarter.acres / whole).toBeCloseTo(0.25, 2);
		expect(quarter.acres).toBeCloseTo(2500 / 43560, 3);
		expect(stretchOutline(lane, guidance, 1500, 1600)).toEqual({ geometry: null, acres: 0 });
	});
});
