import { describe, expect, it } from 'vitest';
import { calendarDayIn, gaugeTotals, isCalendarDate, weekStartOf, weeklyTotals } from '../../src/lib/rainfall/totals';

describe('rainfall weeks and totals', () => {
	it('starts weeks on Monday, across month and year ends', () => {
		expect(weekStartOf('2026-06-01')).toBe('2026-06-01'); // a Monday
		expect(weekStartOf('2026-06-07')).toBe('2026-06-01'); // the Sunday after
		expect(weekStartOf('2026-06-08')).toBe('2026-06-08');
		expect(weekStartOf('2026-01-01')).toBe('2025-12-29');
		expect(weekStartOf('2024-03-01')).toBe('2024-02-26');
	});

	it('takes the calendar day in the farm zone, not UTC', () => {
		expect(calendarDayIn(new Date('2026-06-01T03:00:00Z'), 'America/Chicago')).toBe('2026-05-31');
		expect(calendarDayIn(new Date('2026-06-01T05:00:00Z'), 'America/Chicago')).toBe('2026-06-01');
		expect(calendarDayIn(new Date('2026-06-01T03:00:00Z'), 'Europe/Berlin')).toBe('2026-06-01');
	});

	it('accepts only real dates', () => {
		expect(isCalendarDate('2026-02-28')).toBe(true);
		expect(isCalendarDate('2026-02-30')).toBe(false);
		expect(isCalendarDate('2026-6-1')).toBe(false);
	});

	it('sums per gauge and per week, filling empty weeks with 0', () => {
		const readings = [
			{ gaugeId: 'a', date: '2026-05-31', inches: 0.4 },
			{ gaugeId: 'a', date: '2026-06-01', inches: 1.1 },
			{ gaugeId: 'b', date: '2026-06-03', inches: 0.25 },
			{ gaugeId: 'a', date: '2026-06-16', inches: 0.3 }
		];
		expect(gaugeTotals(readings, ['a', 'b', 'c'])).toEqual([
			{ gaugeId: 'a', inches: 1.8, readings: 3, wettestDay: { date: '2026-06-01', inches: 1.1 } },
			{ gaugeId: 'b', inches: 0.25, readings: 1, wettestDay: { date: '2026-06-03', inches: 0.25 } },
			{ gaugeId: 'c', inches: 0, readings: 0, wettestDay: null }
		]);
		expect(weeklyTotals(readings, ['a', 'b'])).toEqual([
			{ weekStart: '2026-05-25', weekEnd: '2026-05-31', byGauge: { a: 0.4, b: 0 } },
			{ weekStart: '2026-06-01', weekEnd: '2026-06-07', byGauge: { a: 1.1, b: 0.25 } },
			{ weekStart: '2026-06-08', weekEnd: '2026-06-14', byGauge: { a: 0, b: 0 } },
			{ weekStart: '2026-06-15', weekEnd: '2026-06-21', byGauge: { a: 0.3, b: 0 } }
		]);
		expect(weeklyTotals([], ['a'])).toEqual([]);
	});
});
