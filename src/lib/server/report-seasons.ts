// Which crop year a report page shows: the one asked for, else this year in the farm's zone;
// with the seasons that have adopted plans to choose from.
import { db } from './db';
import type { FarmAccess } from './access';
import { isSeasonText } from './season';
import { dayInZone } from '../reports/acreage';

export async function reportSeasons(access: FarmAccess, asked: string | null): Promise<{ season: number; seasons: number[] }> {
	const q = db()('plans').where({ farm_id: access.farm.id, adopted: true }).whereNull('deleted_at').distinct('season').orderBy('season', 'desc');
	if (access.fieldScope !== null) q.whereIn('field_id', access.fieldScope);
	const planned: number[] = (await q).map((r) => r.season);
	const thisYear = Number(dayInZone(new Date(), access.farm.timeZone).slice(0, 4));
	const season = asked && isSeasonText(asked) ? Number(asked) : thisYear;
	const seasons = [...new Set([...planned, thisYear, season])].sort((a, b) => b - a);
	return { season, seasons };
}
