// Yield-monitor files: the app stores the upload and queues it; a worker process reads it, cleans the
// points, sets them into the season's lanes and stores one summary per lane. A failed file leaves
// no partial results: the summary is written in one transaction, or the import is marked failed.
import type { Knex } from 'knex';
import { z } from 'zod';
import { db } from './db';
import { recordAudit } from './audit';
import { AppError, invalid, notFound } from './errors';
import { canSeeField, isUuid, type FarmAccess } from './access';
import { readBodyUpTo } from './read-body';
import { queueYieldImport } from './jobs';
import { guessMapping, mappingProblems, type YieldMapping } from '../harvest/yield-columns';
import { cleanPoints, readHeaders, readYieldCsv, summariseByLane, YieldFileError, type ImportCounts, type ImportLane, type LaneSummary } from '../harvest/yield-points';

/** Largest yield file taken: about 130,000 points of a typical export. */
export const YIELD_UPLOAD_LIMIT = 11 * 1024 * 1024;

export const yieldMappingSchema = z.object({
	longitude: z.string().min(1).max(200),
	latitude: z.string().min(1).max(200),
	yield: z.string().max(200).nullish(),
	massFlow: z.string().max(200).nullish(),
	moisture: z.string().min(1).max(200),
	swathWidth: z.string().max(200).nullish(),
	time: z.string().min(1).max(200),
	speed: z.string().max(200).nullish(),
	yieldBasis: z.enum(['dry', 'wet']).default('dry'),
	swathUnit: z.enum(['ft', 'in', 'm']).default('ft'),
	speedUnit: z.enum(['mph', 'km/h']).default('mph')
});

export type ImportStatus = 'needs_mapping' | 'queued' | 'running' | 'done' | 'failed';

export interface YieldImport {
	id: string;
	fieldId: string;
	season: number;
	sourceName: string;
	fileName: string;
	fileBytes: number;
	headers: string[];
	mapping: YieldMapping | null;
	suggestedMapping: Partial<YieldMapping> | null;
	status: ImportStatus;
	progress: number;
	counts: ImportCounts | Record<string, never>;
	lanes: LaneSummary[];
	error: string | null;
	createdAt: string;
	finishedAt: string | null;
	version: number;
}

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Row = any;

function toImport(r: Row): YieldImport {
	const headers: string[] = r.headers ?? [];
	return {
		id: r.id, fieldId: r.field_id, season: r.season, sourceName: r.source_name, fileName: r.file_name, fileBytes: r.file_bytes,
		headers, mapping: r.mapping ?? null, suggestedMapping: r.status === 'needs_mapping' ? guessMapping(headers) : null,
		status: r.status, progress: Number(r.progress), counts: r.counts ?? {}, lanes: ((r.lane_summaries ?? []) as (LaneSummary & { geometry?: unknown })[]).map(({ geometry: _g, ...l }) => l), error: r.error,
		createdAt: new Date(r.created_at).toISOString(), finishedAt: r.finished_at ? new Date(r.finished_at).toISOString() : null, version: r.version
	};
}

export interface YieldUpload {
	fileName: string;
	text: string;
	sourceName: string;
	mapping: unknown;
}

/** Reads the multipart upload (fields: file, source, mapping as JSON text), refusing more than the limit as it arrives. */
export async function readYieldUpload(request: Request): Promise<YieldUpload> {
	const declared = Number(request.headers.get('content-length') ?? 0);
	const framing = 64 * 1024;
	if (declared > YIELD_UPLOAD_LIMIT + framing) throw tooLarge(declared);
	let bytes: Uint8Array<ArrayBuffer> | null;
	try {
		bytes = await readBodyUpTo(request.body, YIELD_UPLOAD_LIMIT + framing, 'release');
	} catch (e) {
		if ((e as { status?: number })?.status === 413) throw tooLarge(null);
		throw new AppError(400, 'The upload was interrupted before it was complete; send the file again.', 'bad_upload');
	}
	if (!bytes) throw tooLarge(null);
	let form: FormData;
	try {
		form = await new Response(bytes, { headers: { 'content-type': request.headers.get('content-type') ?? '' } }).formData();
	} catch {
		throw new AppError(400, 'Send the yield file as multipart/form-data in a field named "file".', 'bad_upload');
	}
	const file = form.get('file');
	if (!(file instanceof File) || file.size === 0) throw invalid('Choose a yield-monitor CSV file to import.', { file: ['Choose a file.'] });
	if (file.size > YIELD_UPLOAD_LIMIT) throw tooLarge(file.size);
	const sourceName = String(form.get('source') ?? '').trim();
	if (!sourceName || sourceName.length > 100) throw invalid('Name the source of the file (the combine or display it came from), up to 100 characters.', { source: ['Name the source.'] });
	const mappingText = form.get('mapping');
	let mapping: unknown = null;
	if (typeof mappingText === 'string' && mappingText.trim()) {
		try {
			mapping = JSON.parse(mappingText);
		} catch {
			throw invalid('The column mapping is not valid JSON.', { mapping: ['Not valid JSON.'] });
		}
	}
	const raw = new Uint8Array(await file.arrayBuffer());
	let text: string;
	try {
		text = new TextDecoder('utf-8', { fatal: true }).decode(raw).replace(/^\uFEFF/, '');
	} catch {
		throw invalid('The file is not UTF-8 text: export the yield data as CSV (comma, semicolon or tab separated).', { file: ['Not a text file.'] });
	}
	if (text.includes('\u0000')) throw invalid('The file holds binary data, not CSV text.', { file: ['Not a CSV file.'] });
	return { fileName: (file.name || 'yield.csv').slice(0, 200), text, sourceName, mapping };
}

function tooLarge(bytes: number | null) {
	const mb = (n: number) => (n / 1024 / 1024).toFixed(1);
	const limit = `yield files are limited to ${mb(YIELD_UPLOAD_LIMIT)} MB (split a larger file by field or by day)`;
	const message = bytes === null ? `The file is larger than the limit: ${limit}.` : `The file is ${mb(bytes)} MB; ${limit}.`;
	return new AppError(413, message, 'too_large', { file: [message] });
}

async function requireFieldPlan(q: Knex | Knex.Transaction, access: FarmAccess, fieldId: string, season: number) {
	if (!isUuid(fieldId) || !canSeeField(access, fieldId)) throw notFound('field');
	const field = await q('fields').where({ id: fieldId, farm_id: access.farm.id }).whereNull('deleted_at').first('id');
	if (!field) throw notFound('field');
	const plan = await q('plans').where({ farm_id: access.farm.id, field_id: fieldId, season, adopted: true }).whereNull('deleted_at').first('id', 'version');
	if (!plan) throw invalid(`The field has no adopted plan for ${season}: points are set into the season's lanes, so lay them out first.`, { file: [`No plan for ${season}.`] });
	return plan as { id: string; version: number };
}

function checkedMapping(raw: unknown, headers: string[]): YieldMapping {
	const parsed = yieldMappingSchema.safeParse(raw);
	if (!parsed.success) throw invalid('The column mapping is incomplete; choose a column for each value.', Object.fromEntries(parsed.error.issues.map((i) => [`mapping.${i.path.join('.')}`, [i.message]])));
	const problems = mappingProblems(parsed.data, headers);
	if (Object.keys(problems).length) throw invalid(Object.values(problems).flat().join(' '), Object.fromEntries(Object.entries(problems).map(([k, v]) => [`mapping.${k}`, v])));
	return parsed.data as YieldMapping;
}

async function saveMapping(trx: Knex.Transaction, access: FarmAccess, sourceName: string, mapping: YieldMapping) {
	await trx.raw(
		`INSERT INTO yield_column_mappings (farm_id, source_name, mapping, updated_by) VALUES (?, ?, ?, ?)
		 ON CONFLICT (farm_id, lower(source_name)) DO UPDATE SET mapping = excluded.mapping, updated_by = excluded.updated_by, updated_at = now()`,
		[access.farm.id, sourceName, JSON.stringify(mapping), access.user.id]
	);
}

/** The mappings saved for this farm's sources, by source name. */
export async function listMappings(access: FarmAccess): Promise<{ sourceName: string; mapping: YieldMapping; updatedAt: string }[]> {
	const rows = await db()('yield_column_mappings').where({ farm_id: access.farm.id }).orderByRaw('lower(source_name)');
	return rows.map((r: Row) => ({ sourceName: r.source_name, mapping: r.mapping, updatedAt: new Date(r.updated_at).toISOString() }));
}

/**
 * Stores an uploaded file for the season. With a mapping sent, or one saved for the same source whose
 * columns the file has, it is queued at once; otherwise it waits for the user to name its columns.
 */
export async function startYieldImport(access: FarmAccess, fieldId: string, season: number, upload: YieldUpload): Promise<YieldImport> {
	let headers: string[];
	try {
		headers = readHeaders(upload.text).headers;
	} catch (e) {
		if (e instanceof YieldFileError) throw invalid(e.message, { file: [e.message] });
		throw e;
	}
	const row = await db().transaction(async (trx) => {
		const plan = await requireFieldPlan(trx, access, fieldId, season);
		let mapping: YieldMapping | null = null;
		if (upload.mapping) {
			mapping = checkedMapping(upload.mapping, headers);
			await saveMapping(trx, access, upload.sourceName, mapping);
		} else {
			const saved = await trx('yield_column_mappings').where({ farm_id: access.farm.id }).whereRaw('lower(source_name) = lower(?)', [upload.sourceName]).first('mapping');
			if (saved && !Object.keys(mappingProblems(saved.mapping, headers)).length) mapping = saved.mapping;
		}
		const [r] = await trx('yield_imports').insert({
			farm_id: access.farm.id, field_id: fieldId, season, plan_id: plan.id, plan_version: plan.version,
			source_name: upload.sourceName, file_name: upload.fileName, file_bytes: Buffer.byteLength(upload.text), headers,
			mapping: mapping ? JSON.stringify(mapping) : null, status: mapping ? 'queued' : 'needs_mapping',
			created_by: access.user.id, updated_by: access.user.id
		}).returning('*');
		await trx('yield_import_files').insert({ import_id: r.id, farm_id: access.farm.id, content: Buffer.from(upload.text, 'utf8') });
		await recordAudit(trx, { farmId: access.farm.id, userId: access.user.id, entity: 'yield_import', entityId: r.id, action: 'create', after: { fileName: r.file_name, sourceName: r.source_name, status: r.status } });
		return r;
	});
	if (row.status === 'queued') await enqueue(row.id);
	return toImport(row.status === 'queued' ? await db()('yield_imports').where({ id: row.id }).first() : row);
}

async function enqueue(importId: string) {
	try {
		await queueYieldImport(importId);
	} catch (e) {
		console.error('yield import: could not queue', importId, e);
		await db()('yield_imports').where({ id: importId, status: 'queued' })
			.update({ status: 'failed', error: 'The file could not be queued for reading; try the import again in a moment.', finished_at: db().fn.now() });
		await db()('yield_import_files').where({ import_id: importId }).delete();
	}
}

/** Names the columns of a waiting file, saves the mapping for its source, and queues the file. */
export async function setImportMapping(access: FarmAccess, fieldId: string, season: number, importId: string, rawMapping: unknown): Promise<YieldImport> {
	const current = await getYieldImport(access, fieldId, season, importId);
	if (current.status !== 'needs_mapping') throw new AppError(409, `This import is already ${current.status.replace('_', ' ')}; its columns cannot be changed now.`, 'import_started');
	const mapping = checkedMapping(rawMapping, current.headers);
	await db().transaction(async (trx) => {
		const updated = await trx('yield_imports').where({ id: importId, farm_id: access.farm.id, status: 'needs_mapping' })
			.update({ mapping: JSON.stringify(mapping), status: 'queued', version: current.version + 1, updated_by: access.user.id, updated_at: trx.fn.now() });
		if (!updated) throw new AppError(409, 'Someone else started this import a moment ago; reload to see it.', 'import_started');
		await saveMapping(trx, access, current.sourceName, mapping);
	});
	await enqueue(importId);
	return getYieldImport(access, fieldId, season, importId);
}

export async function getYieldImport(access: FarmAccess, fieldId: string, season: number, importId: string): Promise<YieldImport> {
	if (!isUuid(importId) || !isUuid(fieldId) || !canSeeField(access, fieldId)) throw notFound('yield import');
	const row = await db()('yield_imports').where({ id: importId, farm_id: access.farm.id, field_id: fieldId, season }).whereNull('deleted_at').first();
	if (!row) throw notFound('yield import');
	return toImport(row);
}

export async function listYieldImports(access: FarmAccess, fieldId: string, season: number): Promise<YieldImport[]> {
	if (!isUuid(fieldId) || !canSeeField(access, fieldId)) throw notFound('field');
	const field = await db()('fields').where({ id: fieldId, farm_id: access.farm.id }).whereNull('deleted_at').first('id');
	if (!field) throw notFound('field');
	const rows = await db()('yield_imports').where({ farm_id: access.farm.id, field_id: fieldId, season }).whereNull('deleted_at').orderBy('created_at', 'desc');
	return rows.map(toImport);
}

/**
 * Worker side: reads a queued file and stores its per-lane summary. Claims the import first, so a
 * second worker handed the same id does nothing.
 */
export async function processYieldImport(importId: string): Promise<void> {
	const claimed = await db()('yield_imports').where({ id: importId, status: 'queued' })
		.update({ status: 'running', started_at: db().fn.now(), progress: 0.05 }).returning(['id', 'farm_id', 'plan_id', 'mapping']);
	if (!claimed.length) return;
	const job = claimed[0];
	const progress = (share: number) => db()('yield_imports').where({ id: importId }).update({ progress: share });
	try {
		const file = await db()('yield_import_files').where({ import_id: importId }).first('content');
		if (!file) throw new YieldFileError('The uploaded file is no longer stored; upload it again.', 'file_gone');
		const laneRows = job.plan_id ? await db()('plan_lanes').where({ plan_id: job.plan_id }).orderBy('lane_index') : [];
		if (!laneRows.length) throw new YieldFileError('The season\u2019s plan has no lanes any more; adopt a plan and import again.', 'no_lanes');
		const lanes: ImportLane[] = laneRows.map((l: Row) => ({
			laneIndex: l.lane_index, kind: l.kind, crop: l.crop, acres: Number(l.acres), variety: l.variety, trialLabel: l.trial_label, geometry: l.geometry
		}));
		const text = (file.content as Buffer).toString('utf8');
		const read = readYieldCsv(text, job.mapping);
		await progress(0.4);
		const cleaned = cleanPoints(read.points);
		await progress(0.55);
		const summary = summariseByLane(read.points, cleaned, lanes, job.mapping);
		await progress(0.9);
		if (summary.counts.read > 0 && summary.counts.outsideLanes === summary.counts.read - summary.counts.dropped.unreadable) {
			throw new YieldFileError(`None of the ${summary.counts.read} points lies in a grain lane of this field's plan: is this the right field, or are longitude and latitude swapped?`, 'outside_field');
		}
		await db().transaction(async (trx) => {
			// Each lane keeps its outline as it stood, so later seasons can find the same ground.
			const outlines = new Map(lanes.map((l) => [l.laneIndex, l.geometry]));
			const stored = summary.lanes.map((l) => ({ ...l, geometry: outlines.get(l.laneIndex) }));
			await trx('yield_imports').where({ id: importId }).update({
				status: 'done', progress: 1, counts: JSON.stringify(summary.counts), lane_summaries: JSON.stringify(stored), finished_at: trx.fn.now(), error: null
			});
			await trx('yield_import_files').where({ import_id: importId }).delete();
		});
	} catch (e) {
		const message = e instanceof YieldFileError ? e.message : 'The file could not be read because of a fault on our side; nothing from it was kept.';
		if (!(e instanceof YieldFileError)) console.error(`yield import ${importId} failed`, e);
		await db().transaction(async (trx) => {
			await trx('yield_imports').where({ id: importId }).update({ status: 'failed', error: message, counts: '{}', lane_summaries: '[]', finished_at: trx.fn.now() });
			await trx('yield_import_files').where({ import_id: importId }).delete();
		});
	}
}
