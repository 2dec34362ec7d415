// Which season a farm page opens on. Pure; "today" is the farm's calendar, not the server's.
import { TZDate } from '@date-fns/tz';

export const FIRST_SEASON = 1900;
export const LAST_SEASON = 2200;

/** The calendar year at `now` in the farm's time zone. */
export function yearInZone(now: Date, timeZone: string): number {
	return new TZDate(now.getTime(), timeZone).getFullYear();
}

/**
 * The season a farm map opens on: the latest season with plans up to next year, else this year.
 * @example defaultSeason([2024, 2025, 2026, 2031], 2026) // 2026
 */
export function defaultSeason(plannedSeasons: readonly number[], thisYear: number): number {
	const near = plannedSeasons.filter((s) => s <= thisYear + 1);
	return near.length ? Math.max(...near) : thisYear;
}

/**
 * The season the winter planning board works on: from August on, next year's crop; before, this
 * year's (common practice: planning starts after harvest; spring planting is still this year's).
 */
export function comingSeason(now: Date, timeZone: string): number {
	const local = new TZDate(now.getTime(), timeZone);
	return local.getMonth() >= 7 ? local.getFullYear() + 1 : local.getFullYear();
}

/** A season one step away, kept within the range plans may use. */
export function stepSeason(season: number, delta: number): number {
	return Math.min(LAST_SEASON, Math.max(FIRST_SEASON, season + delta));
}
