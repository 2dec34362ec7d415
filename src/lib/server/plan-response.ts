// Answers for reads of a saved plan: an ETag from the plan's id, version and last change (every save
// makes a new version; adopting touches updated_at), 304 when the client already holds it, and the serialized body
// remembered under the same tag so repeated reads skip serializing. Access is checked before any of
// this runs, on every request.
import { createHash } from 'node:crypto';
import { versionedMemo } from './versioned-memo';

// Bump when the shape of a plan answer changes, so clients do not keep an old body.
const FORMAT = 1;
const bodies = versionedMemo<string>(64);

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

/** 304 when the request already holds this version, else 200 with the (remembered) body. */
export async function planResponse(request: Request, etag: string, contentType: string, serialize: () => string, headers: Record<string, string> = {}): Promise<Response> {
	const common = { etag, 'cache-control': 'private, no-cache', ...headers };
	if (matches(request.headers.get('if-none-match'), etag)) return new Response(null, { status: 304, headers: common });
	const body = await bodies.get(etag, async () => serialize());
	return new Response(body, { headers: { 'content-type': contentType, ...common } });
}
