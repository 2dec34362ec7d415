import { addDays, addMilliseconds } from 'date-fns';
import { TZDate } from '@date-fns/tz';
import { AgronomyError } from './errors.js';
import { requireDate, requireNonEmpty, requireNonNegative, requireWholeNonNegative } from './validate.js';

/** A label interval: hours (REI), calendar days (PHI, grazing/feeding restriction), or both. */
export interface RestrictionInterval {
	hours?: number;
	days?: number;
}

const MS_PER_HOUR = 3_600_000;

/**
 * When a label restriction ends, counted from the END of the application.
 * Hours are elapsed time (12 h is 12 real hours, even across a clock change). Days are calendar
 * days: the same clock time that many dates later, counted in the time zone the code runs in.
 * Where both are given, days are added first, then hours. The label is the law: the interval
 * itself comes from the product label, never from here.
 *
 * Sources: 40 CFR 170 (Worker Protection Standard: no entry until the restricted-entry interval has
 * expired, counted from the end of application); NPIC (pre-harvest and grazing intervals come from
 * the label).
 *
 * @example restrictionEnds(new Date(2025, 6, 1, 14, 0), { hours: 12 }) // 2 July 2025 02:00
 */
export function restrictionEnds(applicationEnd: Date, interval: RestrictionInterval): Date {
	return endsAfter(requireDate('application end', applicationEnd), interval, 'interval');
}

function endsAfter(end: Date, interval: RestrictionInterval, label: string): Date {
	const days = interval?.days === undefined ? undefined : requireWholeNonNegative(`${label} days`, interval.days, 'days');
	const hours = interval?.hours === undefined ? undefined : requireNonNegative(`${label} hours`, interval.hours, 'h');
	if (days === undefined && hours === undefined) {
		throw new AgronomyError('missing_interval', label, `${label} must give hours or days; got neither`);
	}
	let result = new Date(end.getTime());
	if (days !== undefined) result = addDays(result, days);
	if (hours !== undefined) result = addMilliseconds(result, hours * MS_PER_HOUR);
	return result;
}

/**
 * For several products applied together, the restriction that ends last and when it ends: the
 * longest applies. Ties go to the first listed. `index` points into `intervals`.
 *
 * Source: 40 CFR 170 (Worker Protection Standard).
 */
export function longestRestriction(
	applicationEnd: Date,
	intervals: RestrictionInterval[]
): { ends: Date; index: number } {
	const end = requireDate('application end', applicationEnd);
	const list = requireNonEmpty<RestrictionInterval>('intervals', intervals);
	let longest = { ends: endsAfter(end, list[0], 'interval 1'), index: 0 };
	for (let i = 1; i < list.length; i++) {
		const ends = endsAfter(end, list[i], `interval ${i + 1}`);
		if (ends.getTime() > longest.ends.getTime()) longest = { ends, index: i };
	}
	return longest;
}

/**
 * {@link restrictionEnds} with calendar days counted in a named time zone (the farm's), whatever
 * zone the code runs in: the same local clock time in that zone, that many dates later. Hours stay
 * elapsed time. Sources as for {@link restrictionEnds}.
 *
 * @example restrictionEndsInZone(new Date('2026-03-07T20:00:00Z'), { days: 1 }, 'America/Chicago')
 *          // 2026-03-08T19:00:00Z: 14:00 local both days, one hour fewer across the clock change
 */
export function restrictionEndsInZone(applicationEnd: Date, interval: RestrictionInterval, timeZone: string): Date {
	const end = requireDate('application end', applicationEnd);
	requireTimeZone(timeZone);
	const days = interval?.days === undefined ? undefined : requireWholeNonNegative('interval days', interval.days, 'days');
	const hours = interval?.hours === undefined ? undefined : requireNonNegative('interval hours', interval.hours, 'h');
	if (days === undefined && hours === undefined) {
		throw new AgronomyError('missing_interval', 'interval', 'interval must give hours or days; got neither');
	}
	let result = new Date(end.getTime());
	if (days !== undefined) result = new Date(addDays(new TZDate(result.getTime(), timeZone), days).getTime());
	if (hours !== undefined) result = addMilliseconds(result, hours * MS_PER_HOUR);
	return result;
}

function requireTimeZone(timeZone: string) {
	try {
		new Intl.DateTimeFormat('en-US', { timeZone });
	} catch {
		throw new AgronomyError('invalid_time_zone', 'timeZone', `time zone "${timeZone}" is not a known IANA zone`);
	}
}
