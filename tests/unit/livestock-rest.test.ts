import { describe, expect, it } from 'vitest';
import { restByStretch } from '../../src/lib/livestock/rest';
import { nextStretch, readMoveTime, seasonSpan, moveAt, spansOverlap } from '../../src/lib/livestock/moves';
import { REST_TARGET_DAYS } from '../../src/lib/livestock/species';

const TZ = 'America/Chicago';
const t = (iso: string) => new Date(iso);

describe('rest days per stretch', () => {
	it('splits the lane where moves began and ended and counts calendar days in the farm’s zone', () => {
		const spans = [
			{ laneIndex: 1, fromFt: 0, toFt: 200, startsAt: t('2026-06-01T05:00:00Z'), endsAt: t('2026-06-04T05:00:00Z') },
			{ laneIndex: 1, fromFt: 200, toFt: 400, startsAt: t('2026-06-04T05:00:00Z'), endsAt: t('2026-06-07T05:00:00Z') }
		];
		// 20 June, 10:00 Chicago: the first stretch was left on 4 June (16 days), the second on 7 June (13 days).
		const rest = restByStretch(spans, [{ laneIndex: 1, lengthFt: 1000 }], t('2026-06-20T15:00:00Z'), REST_TARGET_DAYS.sheep.days, TZ);
		expect(rest.map((r) => [r.fromFt, r.toFt, r.restDays, r.rested, r.grazingNow])).toEqual([
			[0, 200, 16, false, false],
			[200, 400, 13, false, false],
			[400, 1000, null, true, false]
		]);
		expect(rest[0].lastGrazedEnd).toBe('2026-06-04T05:00:00.000Z');
		expect(rest[0].targetDays).toBe(40);
	});

	it('a stretch with animals on it is grazing now; a later visit resets the rest', () => {
		const spans = [
			{ laneIndex: 0, fromFt: 0, toFt: 500, startsAt: t('2026-05-01T05:00:00Z'), endsAt: t('2026-05-03T05:00:00Z') },
			{ laneIndex: 0, fromFt: 100, toFt: 300, startsAt: t('2026-06-10T05:00:00Z'), endsAt: t('2026-06-12T05:00:00Z') }
		];
		const during = restByStretch(spans, [{ laneIndex: 0, lengthFt: 500 }], t('2026-06-11T12:00:00Z'), 30, TZ);
		expect(during.map((r) => [r.fromFt, r.toFt, r.grazingNow, r.restDays])).toEqual([
			[0, 100, false, 39],
			[100, 300, true, null],
			[300, 500, false, 39]
		]);
		// Before the second visit started, it does not count yet: one stretch, rested 31 days ≥ 30.
		const before = restByStretch(spans, [{ laneIndex: 0, lengthFt: 500 }], t('2026-06-03T12:00:00Z'), 30, TZ);
		expect(before).toHaveLength(1);
		expect(before[0]).toMatchObject({ fromFt: 0, toFt: 500, restDays: 31, rested: true });
	});

	it('counts calendar days across the spring clock change in the farm’s zone, not elapsed 24-h days', () => {
		// Left at 23:30 Chicago on 7 March 2026 (before the change on 8 March); 00:30 on 9 March is 2 calendar days later.
		const spans = [{ laneIndex: 0, fromFt: 0, toFt: 10, startsAt: t('2026-03-07T05:00:00Z'), endsAt: t('2026-03-08T05:30:00Z') }];
		const rest = restByStretch(spans, [{ laneIndex: 0, lengthFt: 10 }], t('2026-03-09T05:30:00Z'), 30, TZ);
		expect(rest[0].restDays).toBe(2);
	});
});

describe('move times and the next stretch', () => {
	it('a bare date is local midnight in the farm’s zone; as an end, the next midnight', () => {
		expect(readMoveTime('2026-06-01', TZ)!.toISOString()).toBe('2026-06-01T05:00:00.000Z');
		expect(readMoveTime('2026-06-03', TZ, true)!.toISOString()).toBe('2026-06-04T05:00:00.000Z');
		expect(readMoveTime('2026-01-15', TZ)!.toISOString()).toBe('2026-01-15T06:00:00.000Z');
		expect(readMoveTime('2026-06-01T08:00:00-05:00', TZ)!.toISOString()).toBe('2026-06-01T13:00:00.000Z');
		expect(readMoveTime('2026-02-30', TZ)).toBeNull();
		expect(readMoveTime('June 1', TZ)).toBeNull();
		expect(readMoveTime('2026-06-01T08:00:00', TZ)).toBeNull(); // no offset: ambiguous
	});

	it('the season is the calendar year in the farm’s zone', () => {
		const s = seasonSpan(2026, TZ);
		expect(s.startsAt.toISOString()).toBe('2026-01-01T06:00:00.000Z');
		expect(s.endsAt.toISOString()).toBe('2027-01-01T06:00:00.000Z');
	});

	it('the next stretch is the same length straight on, for the same time, cut at the lane’s end', () => {
		const last = { laneIndex: 3, fromFt: 0, toFt: 150, startsAt: t('2026-06-01T05:00:00Z'), endsAt: t('2026-06-02T05:00:00Z') };
		const next = nextStretch(last, 400)!;
		expect(next).toEqual({ laneIndex: 3, fromFt: 150, toFt: 300, startsAt: t('2026-06-02T05:00:00Z'), endsAt: t('2026-06-03T05:00:00Z') });
		const end = nextStretch(next, 400)!;
		expect([end.fromFt, end.toFt]).toEqual([300, 400]);
		expect(nextStretch(end, 400)).toBeNull();
	});

	it('finds the move standing at a time, with spans half-open', () => {
		const a = { id: 'a', startsAt: t('2026-06-01T05:00:00Z'), endsAt: t('2026-06-02T05:00:00Z') };
		const b = { id: 'b', startsAt: t('2026-06-02T05:00:00Z'), endsAt: t('2026-06-03T05:00:00Z') };
		expect(moveAt([a, b], t('2026-06-02T05:00:00Z'))!.id).toBe('b');
		expect(moveAt([a, b], t('2026-06-03T05:00:00Z'))).toBeNull();
		expect(spansOverlap(a.startsAt, a.endsAt, b.startsAt, b.endsAt)).toBe(false);
		expect(spansOverlap(a.startsAt, b.endsAt, b.startsAt, b.endsAt)).toBe(true);
	});
});
