// Rainfall arithmetic on calendar days (YYYY-MM-DD, already in the farm's time zone): season
// totals per gauge and weekly buckets for the chart. Pure: no I/O, no clock.
import { TZDate } from '@date-fns/tz';

export interface Reading {
	gaugeId: string;
	date: string; // YYYY-MM-DD
	inches: number;
}

export interface GaugeTotal {
	gaugeId: string;
	inches: number;
	readings: number;
	wettestDay: { date: string; inches: number } | null;
}

export interface WeekBucket {
	/** Monday that starts the week (weeks run Monday to Sunday). */
	weekStart: string;
	/** Sunday that ends it. */
	weekEnd: string;
	byGauge: Record<string, number>;
}

const DAY_MS = 86_400_000;
const DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

/** Days since 1970-01-01 for a calendar date; no time zone enters. */
function dayNumber(date: string): number {
	const m = DATE.exec(date);
	if (!m) throw new Error(`Not a calendar date: ${date}`);
	return Date.UTC(Number(m[1]), Number(m[2]) - 1, Number(m[3])) / DAY_MS;
}

function fromDayNumber(n: number): string {
	return new Date(n * DAY_MS).toISOString().slice(0, 10);
}

export function isCalendarDate(text: string): boolean {
	if (!DATE.test(text)) return false;
	return fromDayNumber(dayNumber(text)) === text; // rejects 2026-02-30
}

/** The Monday of the week holding the date. */
export function weekStartOf(date: string): string {
	const n = dayNumber(date);
	const weekday = (((n + 3) % 7) + 7) % 7; // 1970-01-01 was a Thursday; Monday = 0
	return fromDayNumber(n - weekday);
}

/** The calendar day an instant falls on in the zone, e.g. 2026-06-01T03:00Z → 2026-05-31 in America/Chicago. */
export function calendarDayIn(instant: Date, timeZone: string): string {
	const d = new TZDate(instant.getTime(), timeZone);
	const pad = (n: number) => String(n).padStart(2, '0');
	return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}`;
}

const round2 = (x: number) => Math.round(x * 100) / 100;

/** Total, count and wettest day per gauge (gauges without readings are listed with 0). */
export function gaugeTotals(readings: Reading[], gaugeIds: string[]): GaugeTotal[] {
	return gaugeIds.map((gaugeId) => {
		const own = readings.filter((r) => r.gaugeId === gaugeId);
		const wettest = own.reduce<Reading | null>((w, r) => (w === null || r.inches > w.inches ? r : w), null);
		return {
			gaugeId,
			inches: round2(own.reduce((sum, r) => sum + r.inches, 0)),
			readings: own.length,
			wettestDay: wettest ? { date: wettest.date, inches: wettest.inches } : null
		};
	});
}

/**
 * Weekly sums per gauge, Monday to Sunday, for every week from the first reading's week to the
 * last one's (weeks without readings included, at 0), so the chart's axis has no gaps.
 */
export function weeklyTotals(readings: Reading[], gaugeIds: string[]): WeekBucket[] {
	if (readings.length === 0) return [];
	const starts = readings.map((r) => dayNumber(weekStartOf(r.date)));
	const first = Math.min(...starts);
	const last = Math.max(...starts);
	const weeks: WeekBucket[] = [];
	for (let n = first; n <= last; n += 7) {
		weeks.push({ weekStart: fromDayNumber(n), weekEnd: fromDayNumber(n + 6), byGauge: Object.fromEntries(gaugeIds.map((g) => [g, 0])) });
	}
	for (const r of readings) {
		const week = weeks[(dayNumber(weekStartOf(r.date)) - first) / 7];
		if (r.gaugeId in week.byGauge) week.byGauge[r.gaugeId] = round2(week.byGauge[r.gaugeId] + r.inches);
	}
	return weeks;
}

/** Above this a day's reading is kept but flagged: a US 24-hour record is about 42 in (from memory). */
export const PLAUSIBLE_DAILY_MAX_IN = 10;
/** Above this a reading is refused as impossible for a farm gauge. */
export const DAILY_MAX_IN = 45;
