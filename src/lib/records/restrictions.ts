// When people, the combine and animals may go back onto each lane after spraying. Pure.
import { restrictionEndsInZone } from '../agronomy/index';

/** One product put on one lane, with the label intervals recorded with it. */
export interface LaneApplication {
	laneIndex: number;
	endedAt: Date;
	reiHours: number | null;
	phiDays: number | null;
	grazingDays: number | null;
}

export interface LaneRestriction {
	laneIndex: number;
	reentryAt: string | null;
	harvestAt: string | null;
	grazingAt: string | null;
}

/**
 * For each lane, when the restrictions in force at `at` end: REI in elapsed hours, PHI and grazing
 * intervals in calendar days in the farm's time zone (40 CFR 170 for re-entry; the label for all
 * three). Only work ended by `at` counts; with several products or records the longest wins; a
 * restriction already over at `at` is null.
 */
export function laneRestrictionsAt(laneIndexes: number[], applications: LaneApplication[], at: Date, timeZone: string): LaneRestriction[] {
	const latest = new Map<number, { reentry: number; harvest: number; grazing: number }>();
	for (const a of applications) {
		if (a.endedAt.getTime() > at.getTime()) continue;
		const ends = latest.get(a.laneIndex) ?? { reentry: 0, harvest: 0, grazing: 0 };
		if (a.reiHours != null) ends.reentry = Math.max(ends.reentry, restrictionEndsInZone(a.endedAt, { hours: a.reiHours }, timeZone).getTime());
		if (a.phiDays != null) ends.harvest = Math.max(ends.harvest, restrictionEndsInZone(a.endedAt, { days: a.phiDays }, timeZone).getTime());
		if (a.grazingDays != null) ends.grazing = Math.max(ends.grazing, restrictionEndsInZone(a.endedAt, { days: a.grazingDays }, timeZone).getTime());
		latest.set(a.laneIndex, ends);
	}
	const inForce = (t: number | undefined) => (t && t > at.getTime() ? new Date(t).toISOString() : null);
	return laneIndexes.map((laneIndex) => {
		const ends = latest.get(laneIndex);
		return { laneIndex, reentryAt: inForce(ends?.reentry), harvestAt: inForce(ends?.harvest), grazingAt: inForce(ends?.grazing) };
	});
}
