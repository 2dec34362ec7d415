// Rest of each stretch of a lane since animals last stood on it. Pure.
import { differenceInCalendarDays } from 'date-fns';
import { TZDate } from '@date-fns/tz';

export interface GrazedSpan {
	laneIndex: number;
	fromFt: number;
	toFt: number;
	startsAt: Date;
	endsAt: Date;
}

export interface StretchRest {
	laneIndex: number;
	fromFt: number;
	toFt: number;
	/** When animals last left it (by `at`), or null if never grazed this season. */
	lastGrazedEnd: string | null;
	/** Animals are on it at `at`. */
	grazingNow: boolean;
	/** Calendar days (farm time zone) since animals left; null if never grazed or grazed now. */
	restDays: number | null;
	targetDays: number;
	/** Rested at least the target (or never grazed). */
	rested: boolean;
}

/**
 * Splits each lane at every move's ends and tells, for each piece, how long it has rested at `at`
 * against the target. Only moves started by `at` count. Pieces never grazed run from 0 to
 * `laneLengthFt`; rest is counted in calendar days in the farm's time zone.
 */
export function restByStretch(
	spans: GrazedSpan[],
	lanes: { laneIndex: number; lengthFt: number }[],
	at: Date,
	targetDays: number,
	timeZone: string
): StretchRest[] {
	const out: StretchRest[] = [];
	const t = at.getTime();
	for (const lane of lanes) {
		const mine = spans.filter((s) => s.laneIndex === lane.laneIndex && s.startsAt.getTime() <= t);
		const cuts = new Set<number>([0, lane.lengthFt]);
		for (const s of mine) {
			cuts.add(Math.max(0, Math.min(lane.lengthFt, s.fromFt)));
			cuts.add(Math.max(0, Math.min(lane.lengthFt, s.toFt)));
		}
		const points = [...cuts].sort((a, b) => a - b);
		let previous: StretchRest | null = null;
		for (let i = 0; i + 1 < points.length; i++) {
			const from = points[i];
			const to = points[i + 1];
			if (to - from < 0.01) continue;
			const covering = mine.filter((s) => s.fromFt <= from + 1e-6 && s.toFt >= to - 1e-6);
			const grazingNow = covering.some((s) => s.endsAt.getTime() > t);
			const last = covering.length ? Math.max(...covering.map((s) => Math.min(s.endsAt.getTime(), t))) : null;
			const restDays = grazingNow || last === null ? null : differenceInCalendarDays(new TZDate(t, timeZone), new TZDate(last, timeZone));
			const piece: StretchRest = {
				laneIndex: lane.laneIndex,
				fromFt: from,
				toFt: to,
				lastGrazedEnd: last === null || grazingNow ? null : new Date(last).toISOString(),
				grazingNow,
				restDays,
				targetDays,
				rested: !grazingNow && (restDays === null || restDays >= targetDays)
			};
			// Neighbouring pieces with the same history read as one stretch.
			if (previous && previous.lastGrazedEnd === piece.lastGrazedEnd && previous.grazingNow === piece.grazingNow && previous.restDays === piece.restDays) {
				previous.toFt = to;
				continue;
			}
			out.push(piece);
			previous = piece;
		}
	}
	return out;
}
