// A field's season of harvest, analysed: yield by lane, the edge effect, trial blocks, strips against
// the check strip, the land equivalent ratio, and the same ground in earlier seasons.
import type { MultiPolygon, Polygon } from 'geojson';
import { db } from './db';
import type { FarmAccess } from './access';
import { listHarvest, seasonLanes, type HarvestEntry, type StoredLane } from './harvest';
import {
	checkComparisons, edgeEffects, landEquivalent, laneYields, varietyTrials,
	type AnalysisEntry, type AnalysisLane, type EdgeEffect, type GroupComparison, type LandEquivalent, type LaneYield, type MonitorLaneYield, type VarietyTrial
} from '../harvest/analysis';
import { groundHistory, type GroundHistory, type PastLane } from '../harvest/season-over-season';

export interface HarvestAnalysis {
	season: number;
	hasPlan: boolean;
	entries: number;
	lanes: LaneYield[];
	edge: EdgeEffect[];
	trials: VarietyTrial[];
	checks: GroupComparison[];
	ler: LandEquivalent;
	history: GroundHistory[];
	monitorImportId: string | null;
}

const toAnalysisLane = (l: StoredLane): AnalysisLane => ({
	laneIndex: l.laneIndex, kind: l.kind, crop: l.crop, acres: l.acres, widthFt: l.widthFt, rows: l.rows, borderRows: l.borderRows,
	variety: l.variety, trialLabel: l.trialLabel
});

const toAnalysisEntry = (e: HarvestEntry): AnalysisEntry => ({
	rowPosition: e.rowPosition, crop: e.crop, bushelsPerAcre: e.bushelsPerAcre, harvestedAcres: e.harvestedAcres, laneIndexes: e.laneIndexes
});

/** Lanes as the entries recorded them, and the plan's for lanes nobody weighed yet. */
function lanesOf(entries: HarvestEntry[], planLanes: StoredLane[]): StoredLane[] {
	const byIndex = new Map<number, StoredLane>();
	for (const l of planLanes) byIndex.set(l.laneIndex, l);
	for (const e of entries) for (const l of e.lanes) byIndex.set(l.laneIndex, l);
	return [...byIndex.values()].sort((a, b) => a.laneIndex - b.laneIndex);
}

/** The latest finished yield-monitor import's lane means for the season, if any. */
async function monitorYields(access: FarmAccess, fieldId: string, season: number): Promise<{ id: string | null; lanes: MonitorLaneYield[] }> {
	const row = await db()('yield_imports').where({ farm_id: access.farm.id, field_id: fieldId, season, status: 'done' }).whereNull('deleted_at')
		.orderBy('finished_at', 'desc').first('id', 'lane_summaries');
	if (!row) return { id: null, lanes: [] };
	const lanes = (row.lane_summaries as { laneIndex: number; meanBushelsPerAcre: number | null; points: number }[])
		.filter((l) => l.meanBushelsPerAcre != null)
		.map((l) => ({ laneIndex: l.laneIndex, meanBushelsPerAcre: l.meanBushelsPerAcre!, points: l.points }));
	return { id: row.id, lanes };
}

/**
 * Earlier seasons' lanes of the field with their whole-lane yields as of that season: from the weighed
 * loads, or, for a season with none, from its latest yield-monitor file (each keeps its lanes' outlines).
 */
async function pastLanes(access: FarmAccess, fieldId: string, season: number): Promise<PastLane[]> {
	const q = (table: string) => db()(table).where({ farm_id: access.farm.id, field_id: fieldId }).where('season', '<', season).whereNull('deleted_at');
	const weighed = new Set<number>((await q('harvest_entries').distinct('season')).map((r) => r.season));
	const monitored = new Set<number>((await q('yield_imports').where({ status: 'done' }).distinct('season')).map((r) => r.season));
	const seasons = [...new Set([...weighed, ...monitored])].sort((a, b) => b - a).slice(0, 10);
	const out: PastLane[] = [];
	for (const s of seasons) {
		if (weighed.has(s)) {
			const entries = await listHarvest(access, fieldId, s);
			const lanes = lanesOf(entries, []);
			const yields = laneYields(lanes.map(toAnalysisLane), entries.map(toAnalysisEntry));
			const geometry = new Map(lanes.map((l) => [l.laneIndex, l.geometry as Polygon | MultiPolygon]));
			for (const y of yields) out.push({ season: s, laneIndex: y.laneIndex, crop: y.crop, geometry: geometry.get(y.laneIndex)!, bushelsPerAcre: y.laneYield });
			continue;
		}
		const row = await q('yield_imports').where({ season: s, status: 'done' }).orderBy('finished_at', 'desc').first('lane_summaries');
		for (const l of (row?.lane_summaries ?? []) as { laneIndex: number; crop: string; meanBushelsPerAcre: number | null; geometry?: Polygon | MultiPolygon }[]) {
			if (l.geometry) out.push({ season: s, laneIndex: l.laneIndex, crop: l.crop, geometry: l.geometry, bushelsPerAcre: l.meanBushelsPerAcre });
		}
	}
	return out;
}

/** Everything the analysis page shows. `soleYields` are sole-crop bu/ac typed in for crops without a check strip. */
export async function harvestAnalysis(access: FarmAccess, fieldId: string, season: number, soleYields: Record<string, number> = {}): Promise<HarvestAnalysis> {
	const plan = await seasonLanes(access, fieldId, season);
	const entries = await listHarvest(access, fieldId, season);
	const monitor = await monitorYields(access, fieldId, season);
	const stored = lanesOf(entries, plan?.lanes ?? []);
	const analysisEntries = entries.map(toAnalysisEntry);
	const lanes = laneYields(stored.map(toAnalysisLane), analysisEntries, monitor.lanes);
	const past = plan ? await pastLanes(access, fieldId, season) : [];
	const history = plan && past.length
		? groundHistory(plan.lanes.map((l) => ({ laneIndex: l.laneIndex, crop: l.crop, geometry: l.geometry as Polygon | MultiPolygon })), past)
		: [];
	return {
		season, hasPlan: !!plan, entries: entries.length, lanes,
		edge: edgeEffects(lanes, analysisEntries), trials: varietyTrials(lanes), checks: checkComparisons(lanes),
		ler: landEquivalent(lanes, soleYields), history, monitorImportId: monitor.id
	};
}

export interface FarmHarvestRow {
	fieldId: string;
	fieldName: string;
	season: number;
	entries: number;
	byCrop: { crop: string; bushels: number; acres: number; bushelsPerAcre: number }[];
	imports: number;
}

/**
 * Every field × season with harvest on record: entries, bushels and acres per crop (outside and inside
 * rows weighed apart are separate grain and separate acres, so they simply add up). Reports and
 * landlord summaries read their harvest figures from here.
 */
export async function farmHarvestIndex(access: FarmAccess): Promise<FarmHarvestRow[]> {
	const fieldsQuery = db()('fields').where({ farm_id: access.farm.id }).whereNull('deleted_at');
	if (access.fieldScope) fieldsQuery.whereIn('id', access.fieldScope);
	const fields: { id: string; name: string }[] = await fieldsQuery.select('id', 'name');
	if (!fields.length) return [];
	const ids = fields.map((f) => f.id);
	const sums = await db()('harvest_entries').where({ farm_id: access.farm.id }).whereIn('field_id', ids).whereNull('deleted_at')
		.groupBy('field_id', 'season', 'crop')
		.select('field_id', 'season', 'crop')
		.count('* as entries')
		.select(db().raw('sum(bushels) as bushels'))
		.select(db().raw('sum(harvested_acres) as acres'));
	const imports = await db()('yield_imports').where({ farm_id: access.farm.id, status: 'done' }).whereIn('field_id', ids).whereNull('deleted_at')
		.groupBy('field_id', 'season').select('field_id', 'season').count('* as n');
	const names = new Map(fields.map((f) => [f.id, f.name]));
	const rows = new Map<string, FarmHarvestRow>();
	const row = (fieldId: string, season: number) => {
		const key = `${fieldId}:${season}`;
		let r = rows.get(key);
		if (!r) rows.set(key, (r = { fieldId, fieldName: names.get(fieldId) ?? '', season, entries: 0, byCrop: [], imports: 0 }));
		return r;
	};
	for (const s of sums) {
		const r = row(String(s.field_id), Number(s.season));
		r.entries += Number(s.entries);
		r.byCrop.push({ crop: String(s.crop), bushels: Number(s.bushels), acres: Number(s.acres), bushelsPerAcre: Number(s.acres) > 0 ? Number(s.bushels) / Number(s.acres) : 0 });
	}
	for (const i of imports) row(String(i.field_id), Number(i.season)).imports = Number(i.n);
	return [...rows.values()].sort((a, b) => b.season - a.season || a.fieldName.localeCompare(b.fieldName));
}
