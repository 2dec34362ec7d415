// Everything the livestock page shows for one field and season: lanes, moves, where each shelter
// stands on a chosen date, paths over the season, rest per stretch, figures per lane and the
// move-and-rest calendar with blocked dates.
import { TZDate } from '@date-fns/tz';
import { addDays, eachDayOfInterval, endOfMonth, startOfMonth } from 'date-fns';
import type { MultiPolygon, Polygon } from 'geojson';
import { db } from './db';
import { canSeeField, type FarmAccess } from './access';
import { getField } from './fields';
import { getPlan } from './plans';
import { listGroups, type LivestockGroup } from './livestock';
import { listMoves, seasonBlocks, type GrazingMove } from './livestock-moves';
import { laneExtent } from '../livestock/stretch';
import { restByStretch, type StretchRest } from '../livestock/rest';
import { moveAt, nextStretch } from '../livestock/moves';
import { REST_TARGET_DAYS } from '../livestock/species';
import { animalUnits } from '../agronomy/index';
import type { Block } from '../livestock/blocks';

export interface BoardLane {
	index: number;
	kind: string;
	crop: string;
	acres: number;
	widthFt: number;
	lengthFt: number;
	geometry: Polygon | MultiPolygon;
}

export interface LaneFigures {
	laneIndex: number;
	moves: number;
	daysGrazed: number;
	/** Σ AU × days ÷ lane acres over the season. */
	animalUnitDaysPerAcre: number;
	/** Stocking density of the move standing on the lane at the chosen date. */
	currentDensity: number | null;
}

export interface CalendarCell {
	day: string;
	grazedBy: string[];
	blocked: { reason: Block['reason']; cause: string }[];
}

export interface Board {
	season: number;
	date: string;
	fields: { id: string; name: string }[];
	field: { id: string; name: string; boundary: Polygon | MultiPolygon } | null;
	lanes: BoardLane[];
	pastureLanes: BoardLane[];
	groups: (LivestockGroup & { current: GrazingMove | null; last: GrazingMove | null; next: { laneIndex: number; fromFt: number; toFt: number; from: string; to: string } | null })[];
	moves: GrazingMove[];
	shelters: { name: string; groupName: string; position: [number, number] | null; path: [number, number][] }[];
	rest: StretchRest[];
	laneFigures: LaneFigures[];
	blocks: Block[];
	calendar: { month: string; days: string[]; lanes: { laneIndex: number; cells: CalendarCell[] }[] };
	shelterOptions: { id: string; name: string }[];
}

const dayOf = (d: Date, tz: string) => {
	const z = new TZDate(d.getTime(), tz);
	return `${z.getFullYear()}-${String(z.getMonth() + 1).padStart(2, '0')}-${String(z.getDate()).padStart(2, '0')}`;
};

/** Today in the farm's zone, as YYYY-MM-DD. */
export function farmToday(access: FarmAccess): string {
	return dayOf(new Date(), access.farm.timeZone);
}

/** Fields with pasture or cover lanes in the season's adopted plans, that this member may see. */
export async function grazingFields(access: FarmAccess, season: number): Promise<{ id: string; name: string }[]> {
	const rows = await db()('plans as p')
		.join('fields as f', 'f.id', 'p.field_id')
		.join('plan_lanes as l', 'l.plan_id', 'p.id')
		.where({ 'p.farm_id': access.farm.id, 'p.season': season, 'p.adopted': true })
		.whereIn('l.kind', ['pasture', 'cover'])
		.whereNull('p.deleted_at')
		.whereNull('f.deleted_at')
		.groupBy('f.id', 'f.name')
		.orderBy('f.name')
		.select('f.id', 'f.name');
	return rows.filter((r) => canSeeField(access, r.id));
}

export async function livestockBoard(access: FarmAccess, options: { season: number; fieldId: string | null; date: string }): Promise<Board> {
	const tz = access.farm.timeZone;
	const { season, date } = options;
	const [y, m, d] = date.split('-').map(Number);
	const noon = new Date(new TZDate(y, m - 1, d, 12, 0, tz).getTime());
	const fields = await grazingFields(access, season);
	const chosen = fields.find((f) => f.id === options.fieldId) ?? fields[0] ?? null;
	const groupsList = await listGroups(access);
	const shelterOptions = access.can('logRecords') && access.sees.equipment
		? (await db()('equipment').where({ farm_id: access.farm.id, kind: 'shelter' }).whereNull('deleted_at').orderBy('name').select('id', 'name'))
		: [];
	const allMoves = await listMoves(access, { season });
	const groups = groupsList.map((g) => {
		const mine = allMoves.filter((mv) => mv.groupId === g.id);
		const current = moveAt(mine.map((mv) => ({ ...mv, startsAt: new Date(mv.from), endsAt: new Date(mv.to) })), noon);
		const last = mine.length ? mine[mine.length - 1] : null;
		const next = last ? nextStretch({ laneIndex: last.laneIndex, fromFt: last.fromFt, toFt: last.toFt, startsAt: new Date(last.from), endsAt: new Date(last.to) }, last.laneLengthFt) : null;
		return {
			...g,
			current: current ?? null,
			last,
			next: next ? { laneIndex: next.laneIndex, fromFt: next.fromFt, toFt: next.toFt, from: next.startsAt.toISOString(), to: next.endsAt.toISOString() } : null
		};
	});
	const empty: Board = {
		season, date, fields, field: null, lanes: [], pastureLanes: [], groups, moves: [], shelters: [], rest: [], laneFigures: [], blocks: [],
		calendar: { month: date.slice(0, 7), days: [], lanes: [] }, shelterOptions
	};
	if (!chosen) return empty;

	const [field, plan] = await Promise.all([getField(access, chosen.id), getPlan(access, chosen.id, season)]);
	const lanes: BoardLane[] = plan.lanes.map((l) => ({
		index: l.index,
		kind: l.kind,
		crop: l.crop,
		acres: l.acres,
		widthFt: l.widthFt,
		lengthFt: laneExtent(l.geometry, plan.guidance).lengthFt,
		geometry: l.geometry
	}));
	const pastureLanes = lanes.filter((l) => l.kind === 'pasture' || l.kind === 'cover');
	const moves = allMoves.filter((mv) => mv.fieldId === chosen.id);
	const blocks = await seasonBlocks(db(), access, chosen.id, season, pastureLanes.map((l) => l.index));

	// Each lane rests toward the target of the species last on it (sheep when none yet).
	const rest: StretchRest[] = [];
	for (const lane of pastureLanes) {
		const onLane = moves.filter((mv) => mv.laneIndex === lane.index && Date.parse(mv.from) <= noon.getTime());
		const species = onLane.length ? onLane[onLane.length - 1].species : 'sheep';
		rest.push(
			...restByStretch(
				onLane.map((mv) => ({ laneIndex: mv.laneIndex, fromFt: mv.fromFt, toFt: mv.toFt, startsAt: new Date(mv.from), endsAt: new Date(mv.to) })),
				[{ laneIndex: lane.index, lengthFt: lane.lengthFt }],
				noon,
				REST_TARGET_DAYS[species].days,
				tz
			)
		);
	}

	const laneFigures: LaneFigures[] = pastureLanes.map((lane) => {
		const onLane = moves.filter((mv) => mv.laneIndex === lane.index && Date.parse(mv.from) <= noon.getTime());
		let days = 0;
		let auDays = 0;
		for (const mv of onLane) {
			const span = (Math.min(Date.parse(mv.to), noon.getTime()) - Date.parse(mv.from)) / 86_400_000;
			days += span;
			auDays += animalUnits(mv.species, mv.head, mv.averageWeightLb) * span;
		}
		const now = onLane.find((mv) => Date.parse(mv.from) <= noon.getTime() && noon.getTime() < Date.parse(mv.to));
		return { laneIndex: lane.index, moves: onLane.length, daysGrazed: days, animalUnitDaysPerAcre: lane.acres > 0 ? auDays / lane.acres : 0, currentDensity: now ? now.figures.stockingDensityAuPerAcre : null };
	});

	// Shelters: where each stands at the chosen date, and its path over the season on this field.
	const byShelter = new Map<string, GrazingMove[]>();
	for (const mv of moves) {
		const key = mv.shelterName ?? `${mv.groupName} (no shelter)`;
		byShelter.set(key, [...(byShelter.get(key) ?? []), mv]);
	}
	const shelters = [...byShelter.entries()].map(([name, list]) => {
		const here = list.find((mv) => Date.parse(mv.from) <= noon.getTime() && noon.getTime() < Date.parse(mv.to));
		return { name, groupName: list[list.length - 1].groupName, position: here?.position ?? null, path: list.map((mv) => mv.position).filter((p): p is [number, number] => p !== null) };
	});

	// Calendar of the chosen month: who grazed each lane each day, and what blocked it.
	const monthStart = startOfMonth(new TZDate(y, m - 1, 1, tz));
	const days = eachDayOfInterval({ start: monthStart, end: endOfMonth(monthStart) }).map((day) => dayOf(day, tz));
	const calendarLanes = pastureLanes.map((lane) => ({
		laneIndex: lane.index,
		cells: days.map((day) => {
			const [yy, mm, dd] = day.split('-').map(Number);
			const start = new TZDate(yy, mm - 1, dd, tz);
			const s = start.getTime();
			const e = addDays(start, 1).getTime();
			const grazedBy = [...new Set(moves.filter((mv) => mv.laneIndex === lane.index && Date.parse(mv.from) < e && Date.parse(mv.to) > s).map((mv) => mv.groupName))];
			const blocked = blocks.filter((b) => b.laneIndex === lane.index && Date.parse(b.startsAt) < e && Date.parse(b.endsAt) > s).map((b) => ({ reason: b.reason, cause: b.cause }));
			return { day, grazedBy, blocked };
		})
	}));

	return {
		season,
		date,
		fields,
		field: { id: field.id, name: field.name, boundary: field.boundary },
		lanes,
		pastureLanes,
		groups,
		moves,
		shelters,
		rest,
		laneFigures,
		blocks,
		calendar: { month: date.slice(0, 7), days, lanes: calendarLanes },
		shelterOptions
	};
}
