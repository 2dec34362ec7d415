// The span and stretch of a grazing move, and the next one along the lane. Pure.
import { addDays } from 'date-fns';
import { TZDate } from '@date-fns/tz';

const DATE_ONLY = /^(\d{4})-(\d{2})-(\d{2})$/;
const DAY = 86_400_000;

/**
 * An instant from what a person or a client sends: an ISO 8601 time with an offset, or a bare
 * date. A bare date is local midnight in the farm's zone; as an end (`endOfDay`) it is the next
 * local midnight, so "1 June to 3 June" covers all three days. Null when it cannot be read.
 */
export function readMoveTime(value: string, timeZone: string, endOfDay = false): Date | null {
	const m = DATE_ONLY.exec(value);
	if (m) {
		const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
		const local = new TZDate(y, mo - 1, d, timeZone);
		if (local.getDate() !== d || local.getMonth() !== mo - 1) return null;
		return new Date((endOfDay ? addDays(local, 1) : local).getTime());
	}
	if (!/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d+)?)?(Z|[+-]\d{2}:?\d{2})$/i.test(value)) return null;
	const t = Date.parse(value);
	return Number.isNaN(t) ? null : new Date(t);
}

/** The season (crop year) as an instant span in the farm's zone: 1 Jan 00:00 to next 1 Jan 00:00. */
export function seasonSpan(season: number, timeZone: string): { startsAt: Date; endsAt: Date } {
	return {
		startsAt: new Date(new TZDate(season, 0, 1, timeZone).getTime()),
		endsAt: new Date(new TZDate(season + 1, 0, 1, timeZone).getTime())
	};
}

/** Whether [a0, a1) and [b0, b1) share any instant. */
export function spansOverlap(a0: Date, a1: Date, b0: Date, b1: Date): boolean {
	return a0.getTime() < b1.getTime() && b0.getTime() < a1.getTime();
}

/** Planned days of a move (may be fractional). */
export function moveDays(startsAt: Date, endsAt: Date): number {
	return (endsAt.getTime() - startsAt.getTime()) / DAY;
}

export interface StretchSpan {
	laneIndex: number;
	fromFt: number;
	toFt: number;
	startsAt: Date;
	endsAt: Date;
}

/**
 * The move after `last`: the same length of lane straight on from where it ended, for the same
 * time, starting when it ends. The last stretch is cut at the lane's end; null when the group has
 * already reached the end (pick another lane).
 */
export function nextStretch(last: StretchSpan, laneLengthFt: number): StretchSpan | null {
	const length = last.toFt - last.fromFt;
	const from = last.toFt;
	if (from >= laneLengthFt - 0.5) return null;
	const to = Math.min(laneLengthFt, from + length);
	const duration = last.endsAt.getTime() - last.startsAt.getTime();
	return { laneIndex: last.laneIndex, fromFt: round2(from), toFt: round2(to), startsAt: last.endsAt, endsAt: new Date(last.endsAt.getTime() + duration) };
}

function round2(n: number) {
	return Math.round(n * 100) / 100;
}

/** Where a group or shelter stands at `at`: the move whose span holds it, else null. */
export function moveAt<T extends { startsAt: Date; endsAt: Date }>(moves: T[], at: Date): T | null {
	const t = at.getTime();
	return moves.find((m) => m.startsAt.getTime() <= t && t < m.endsAt.getTime()) ?? null;
}
