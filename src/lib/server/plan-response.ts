// Answers for reads of a saved plan. One light query reads the plan's stamp (id, version, last
// change, adopted; kept a few seconds, until the next write); the ETag comes from it, so a client
// holding this version gets 304 and a body already serialized for it is sent again without reading
// the lanes. Every save makes a new version and adopting touches updated_at, so a stamp never names
// two different bodies. Access is checked
// before any of this runs, on every request, and the stamp is read through getPlan's own query, so it
// follows the same farm, field-scope and deleted-row rules.
import { createHash } from 'node:crypto';
import type { FarmAccess } from './access';
import { seasonPlanQuery } from './plans';
import { versionedMemo } from './versioned-memo';
import { WatchedCache } from './watched-cache';
import { db } from './db';

export interface PlanStamp {
	id: string;
	version: number;
	adopted: boolean;
	updatedAt: Date | string;
	fieldName: string;
}

// Bump when the shape of a plan answer changes, so clients do not keep an old body.
const FORMAT = 1;
// Kept as UTF-8 bytes with their length, so a repeat answer is neither encoded again nor chunked.
const bodies = versionedMemo<Uint8Array<ArrayBuffer>>(64);
const utf8 = new TextEncoder();

// Stamps of the last few seconds, per farm, field, season and variant. Any write to plans, plan
// lanes, fields or farms, from this process or another, empties them (see watched-cache.ts); they are looked up only after the
// access check and seasonPlanQuery's field-scope rule have passed for this member.
const stamps = new WatchedCache<PlanStamp>({ tables: ['plans', 'plan_lanes', 'fields', 'farms'], ttlMs: 5_000, limit: 5_000 });

/** The stamp of the season's adopted plan (or the named variant); null when there is none to show. */
export async function planStamp(access: FarmAccess, fieldId: string, season: number, variant?: string): Promise<PlanStamp | null> {
	const q = seasonPlanQuery(access, fieldId, season, variant);
	if (!q) return null;
	stamps.watch(db());
	return stamps.get(`${access.farm.id}:${fieldId}:${season}:${variant ?? ''}`, async () => {
		const row = await q.options({ name: variant ? 'plan_stamp_variant' : 'plan_stamp' }).first(
			'p.id',
			'p.version',
			'p.adopted',
			'p.updated_at',
			'f.name as field_name'
		);
		return row ? { id: row.id, version: row.version, adopted: row.adopted, updatedAt: row.updated_at, fieldName: row.field_name } : null;
	});
}

/** A weak validator for one plan answer; `extra` names anything else the body shows (e.g. the field's name). */
export function planEtag(kind: string, plan: { id: string; version: number; adopted: boolean; updatedAt: Date | string }, extra = ''): string {
	const more = extra ? `-${createHash('sha1').update(extra).digest('base64url').slice(0, 12)}` : '';
	return `W/"${kind}${FORMAT}-${plan.id}-v${plan.version}${plan.adopted ? 'a' : ''}-${new Date(plan.updatedAt).getTime()}${more}"`;
}

function matches(ifNoneMatch: string | null, etag: string): boolean {
	if (!ifNoneMatch) return false;
	const bare = etag.replace(/^W\//, '');
	return ifNoneMatch.split(',').some((t) => t.trim() === '*' || t.trim().replace(/^W\//, '') === bare);
}

/** 304 when the request already holds this version, else 200 with the body (remembered per tag). */
export async function planResponse(request: Request, etag: string, contentType: string, serialize: () => string | Promise<string>, headers: Record<string, string> = {}): Promise<Response> {
	const common = { etag, 'cache-control': 'private, no-cache', ...headers };
	if (matches(request.headers.get('if-none-match'), etag)) return new Response(null, { status: 304, headers: common });
	const body = await bodies.get(etag, async () => utf8.encode(await serialize()));
	return new Response(body, { headers: { 'content-type': contentType, 'content-length': String(body.byteLength), ...common } });
}
