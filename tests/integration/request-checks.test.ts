// The checks every request passes before a route runs, called with hand-made requests: bodies a
// browser would not send (chunked, damaged) must still get a 400, never reach a route as a 500.
import { describe, expect, it } from 'vitest';
import type { RequestEvent } from '@sveltejs/kit';
import { findJsonProblem, findMalformedParam, findNulInUrl, refuseBadRequest } from '$lib/server/request-checks';

function event(path: string, init: RequestInit & { params?: Record<string, string>; routeId?: string | null } = {}): RequestEvent {
	const url = new URL(`http://127.0.0.1${path}`);
	const request = new Request(url, { ...init, duplex: 'half' } as RequestInit);
	return { url, request, params: init.params ?? {}, route: { id: init.routeId === undefined ? '/farms/[farmId]' : init.routeId } } as unknown as RequestEvent;
}

/** A body streamed in pieces with no Content-Length, as Transfer-Encoding: chunked arrives. */
function chunked(text: string, pieces = 4): ReadableStream<Uint8Array> {
	const bytes = new TextEncoder().encode(text);
	const size = Math.ceil(bytes.length / pieces);
	let at = 0;
	return new ReadableStream({
		pull(c) {
			if (at >= bytes.length) return c.close();
			c.enqueue(bytes.slice(at, (at += size)));
		}
	});
}

const formAction = { method: 'POST', headers: { accept: 'application/json', 'content-type': 'application/x-www-form-urlencoded' } };

describe('request checks', () => {
	it('a NUL character in a chunked form body (no Content-Length) is a 400 naming the field', async () => {
		const res = (await refuseBadRequest(event('/farms/x/settings?/save', { ...formAction, body: chunked('name=Home%20farm&notes=a%00b') })))!;
		expect(res.status).toBe(400);
		expect(await res.json()).toEqual({ type: 'error', error: { code: 'invalid', message: 'The form field "notes" contains a NUL character (\\u0000); remove it and try again.' } });
	});

	it('the route still reads the whole form after the check', async () => {
		const e = event('/farms/x/settings?/save', { ...formAction, body: chunked('name=Home%20farm&notes=fine') });
		expect(await refuseBadRequest(e)).toBeNull();
		expect(Object.fromEntries(await e.request.formData())).toEqual({ name: 'Home farm', notes: 'fine' });
	});

	it('a multipart body that does not match its boundary is a 400, not a crash in the route', async () => {
		const res = (await refuseBadRequest(
			event('/api/farms/x/fields/import', { method: 'POST', headers: { 'content-type': 'multipart/form-data; boundary=abc' }, body: 'this is not multipart at all' })
		))!;
		expect(res.status).toBe(400);
		expect(await res.json()).toEqual({ error: { code: 'bad_form', message: 'The form data could not be read: the body is damaged or does not match its content type.' } });
	});

	it('the reserved action name "default" is a 404', async () => {
		const res = (await refuseBadRequest(event('/farms/x?/default', { ...formAction, body: 'a=1' })))!;
		expect(res.status).toBe(404);
		expect((await res.json()).error.code).toBe('not_found');
	});

	it('an unknown /api address is a JSON 404', async () => {
		const res = (await refuseBadRequest(event('/api/nothing', { routeId: null })))!;
		expect(res.status).toBe(404);
		expect(await res.json()).toEqual({ error: { code: 'not_found', message: 'There is no API at /api/nothing.' } });
	});

	it('a page answers with a plain page whose message is text: a hostile parameter name stays inert', async () => {
		const res = (await refuseBadRequest(event('/farms/x?%3Cimg%20src%3Dx%20onerror%3Dalert(1)%3E=%00', { headers: { accept: 'text/html' } })))!;
		expect(res.status).toBe(400);
		expect(res.headers.get('content-type')).toBe('text/html; charset=utf-8');
		const page = await res.text();
		expect(page).toContain('<h1>The address contains a NUL character (%00) in the query parameter "&lt;img src=x onerror=alert(1)&gt;"; remove it and try again.</h1>');
		expect(page).not.toContain('<img');
	});

	it('names where a NUL sits in an address, and ignores addresses without one', () => {
		expect(findNulInUrl(new URL('http://h/a?variant=%00'))).toBe('the query parameter "variant"');
		expect(findNulInUrl(new URL('http://h/a%00b'))).toBe('the path');
		expect(findNulInUrl(new URL('http://h/a?variant=B&x=%2500'))).toBeNull();
	});

	it('finds id parameters that are not UUIDs and seasons that are not years', () => {
		const farmId = '5a1e0000-0000-4000-8000-00000000f001';
		expect(findMalformedParam({ farmId, fieldId: '5A1E0000-0000-4000-8000-0000000001F2', season: '2025' })).toBeNull();
		expect(findMalformedParam({ farmId, fieldId: 'a'.repeat(36) })).toBe('fieldId');
		expect(findMalformedParam({ farmId: '-'.repeat(36) })).toBe('farmId');
		expect(findMalformedParam({ farmId, season: '2027.5' })).toBe('season');
		expect(findMalformedParam({ token: 'not-a-uuid-and-fine' })).toBeNull();
	});

	it('walks JSON without recursion: depth 32 passes, 33 is refused with its path', () => {
		const nest = (n: number): unknown => (n === 0 ? 'leaf' : [nest(n - 1)]);
		expect(findJsonProblem({ a: nest(31) })).toBeNull();
		expect(findJsonProblem({ a: nest(32) })).toEqual({ kind: 'depth', path: `a${'.0'.repeat(31)}` });
	});
});
