// How the record book writes lanes, times and amounts for people. Pure.
import { format } from 'date-fns';
import { TZDate } from '@date-fns/tz';

/** Lane indexes as people read them: "lanes 1–4, 9". */
export function laneListText(indexes: number[]): string {
	const sorted = [...new Set(indexes)].sort((a, b) => a - b);
	const runs: string[] = [];
	for (let i = 0; i < sorted.length; ) {
		let j = i;
		while (j + 1 < sorted.length && sorted[j + 1] === sorted[j] + 1) j++;
		runs.push(j > i ? `${sorted[i] + 1}–${sorted[j] + 1}` : `${sorted[i] + 1}`);
		i = j + 1;
	}
	return `${sorted.length === 1 ? 'lane' : 'lanes'} ${runs.join(', ')}`;
}

/** The same lanes as a list the lane field reads back ("1-4, 9"). */
export function laneListInput(indexes: number[]): string {
	return laneListText(indexes).replace(/^lanes? /, '').replace(/–/g, '-');
}

/** An instant on the farm's clock: "Tue 2 Jun 2026, 14:30". */
export function farmTime(iso: string, timeZone: string): string {
	return format(new TZDate(new Date(iso).getTime(), timeZone), 'EEE d MMM yyyy, HH:mm');
}

/** The farm's calendar date of an instant, "2026-06-02" (sorts as text). */
export function farmDate(iso: string, timeZone: string): string {
	return format(new TZDate(new Date(iso).getTime(), timeZone), 'yyyy-MM-dd');
}

export function amount(n: number, decimals = 2): string {
	return n.toLocaleString('en-US', { maximumFractionDigits: decimals, minimumFractionDigits: 0 });
}
