// How a request with bad input is answered once it gets past the request checks: the database's
// refusals become 400s, library messages never reach the user, and nothing is half-written.
import { randomUUID } from 'node:crypto';
import { describe, expect, it, vi } from 'vitest';
import { z } from 'zod';
import type { RequestEvent } from '@sveltejs/kit';
import { db } from '$lib/server/db';
import { api, readJson } from '$lib/server/api';
import { fromDatabaseInputError, pageError } from '$lib/server/errors';
import { handleError } from '../../src/hooks.server';
import { thrown } from './helpers';

async function databaseError(sql: string, bindings: unknown[]): Promise<unknown> {
	try {
		await db().raw(sql, bindings as never);
	} catch (e) {
		return e;
	}
	throw new Error('expected PostgreSQL to refuse the value');
}

function jsonEvent(body: string, path = '/api/test'): RequestEvent {
	const url = new URL(`http://127.0.0.1${path}`);
	const request = new Request(url, { method: 'POST', body, headers: { 'content-type': 'application/json' } });
	return { request, url, locals: { user: null, session: null } } as unknown as RequestEvent;
}

const quiet = () => {
	vi.spyOn(console, 'error').mockImplementation(() => {});
	vi.spyOn(console, 'warn').mockImplementation(() => {});
};

describe('PostgreSQL data refusals become 400s', () => {
	it('a NUL character in text (22021) is a 400 that names the NUL, not the driver', async () => {
		const e = await databaseError('select ?::text as t', ['north\u000080']);
		expect((e as { code: string }).code).toBe('22021');
		const refused = fromDatabaseInputError(e)!;
		expect(refused.status).toBe(400);
		expect(refused.code).toBe('invalid');
		expect(refused.message).toBe('A text value contains a NUL character (\\u0000), which cannot be stored. Remove it and try again.');
	});

	it('a malformed id (22P02) and an out-of-range number (22003) are 400s too', async () => {
		const badId = await databaseError('select ?::uuid as id', ['a'.repeat(36)]);
		expect((badId as { code: string }).code).toBe('22P02');
		expect(fromDatabaseInputError(badId)?.status).toBe(400);
		const tooBig = await databaseError('select ?::integer as n', ['1e20']);
		expect(fromDatabaseInputError(tooBig)?.status).toBe(400);
	});

	it('a CHECK constraint (23514) the code did not check first is a 400, not a fault', async () => {
		const table = `check_probe_${randomUUID().slice(0, 8)}`;
		await db().raw(`create table ${table} (amount numeric check (amount > 0))`);
		const e = await databaseError(`insert into ${table} (amount) values (?)`, [0]);
		await db().raw(`drop table ${table}`);
		expect((e as { code: string }).code).toBe('23514');
		const refused = fromDatabaseInputError(e)!;
		expect(refused.status).toBe(400);
		expect(refused.message).toBe('A value is outside what can be stored (for example zero or negative where an amount is needed); check the values and try again.');
	});

	it('other database errors are not mistaken for bad input', async () => {
		const missing = await databaseError('select * from no_such_table_here', []);
		expect((missing as { code: string }).code).toBe('42P01');
		expect(fromDatabaseInputError(missing)).toBeNull();
		expect(fromDatabaseInputError(new Error('plain'))).toBeNull();
	});

	it('the API wrapper answers a database refusal with the JSON error shape and 400, and nothing is written', async () => {
		quiet();
		const table = `nul_probe_${randomUUID().slice(0, 8)}`;
		await db().schema.createTable(table, (t) => t.text('name'));
		try {
			const handler = api(async () => {
				await db().transaction(async (trx) => {
					await trx(table).insert({ name: 'first row' });
					await trx(table).insert({ name: 'second\u0000row' });
				});
				return new Response('written');
			});
			const res = await handler(jsonEvent('{}'));
			expect(res.status).toBe(400);
			expect(await res.json()).toEqual({
				error: { code: 'invalid', message: 'A text value contains a NUL character (\\u0000), which cannot be stored. Remove it and try again.' }
			});
			expect(await db()(table).count({ n: '*' })).toEqual([{ n: 0 }]);
		} finally {
			await db().schema.dropTable(table);
			vi.restoreAllMocks();
		}
	});
});

describe('JSON bodies', () => {
	const anything = z.unknown();

	it('a NUL character anywhere in the body is refused with the place it sits', async () => {
		const e = await thrown(() => readJson(jsonEvent(JSON.stringify({ boundary: { type: 'Polygon' }, notes: ['fine', 'bad\u0000'] })), anything));
		expect(e.status).toBe(400);
		expect((e as unknown as { fields: unknown }).fields).toEqual({ 'notes.1': ['Contains a NUL character (\\u0000), which text may not hold.'] });
	});

	it('a NUL character in a key is refused too', async () => {
		const e = await thrown(() => readJson(jsonEvent('{"na\\u0000me": "x"}'), anything));
		expect(e.status).toBe(400);
		expect(Object.keys((e as unknown as { fields: Record<string, unknown> }).fields)).toEqual(['na\\u0000me']);
	});

	it('a body nested 100,000 levels deep is a 400 "too deeply nested", not a stack overflow', async () => {
		const deep = '['.repeat(100_000) + ']'.repeat(100_000);
		const e = (await thrown(() => readJson(jsonEvent(`{"pattern": ${deep}}`), anything))) as unknown as { status: number; code: string; message: string };
		expect(e.status).toBe(400);
		expect(e.code).toBe('too_deeply_nested');
		expect(e.message).toBe('The request body is too deeply nested (more than 32 levels of arrays and objects).');
	});

	it('GeoJSON as deep as a MultiPolygon with holes passes', async () => {
		const square = [[0, 0], [1, 0], [1, 1], [0, 1], [0, 0]];
		const body = { boundary: { type: 'MultiPolygon', coordinates: [[square, square]] }, exclusions: [{ geometry: { type: 'MultiPolygon', coordinates: [[square]] } }] };
		expect(await readJson(jsonEvent(JSON.stringify(body)), anything)).toEqual(body);
	});
});

describe('unexpected errors', () => {
	it('the API wrapper never passes a library message on: it logs it with an error id', async () => {
		const logged = vi.spyOn(console, 'error').mockImplementation(() => {});
		const res = await api(() => {
			throw new RangeError('Maximum call stack size exceeded');
		})(jsonEvent('{}'));
		expect(res.status).toBe(500);
		const body = (await res.json()) as { error: { code: string; message: string } };
		expect(body.error.code).toBe('internal');
		expect(body.error.message).not.toContain('Maximum call stack');
		const id = body.error.message.match(/error id ([0-9a-f-]{36})/)![1];
		expect(String(logged.mock.calls[0][0])).toBe(`[${id}] POST /api/test`);
		vi.restoreAllMocks();
	});

	it('handleError answers pages calmly, with the error id it logged', async () => {
		const logged = vi.spyOn(console, 'error').mockImplementation(() => {});
		const event = jsonEvent('{}', '/farms/x');
		const body = (await handleError({ error: new RangeError('Maximum call stack size exceeded'), event, status: 500, message: 'Internal Error' }))!;
		expect(body.code).toBe('internal');
		expect(body.message).toBe(`Something went wrong on our side. Nothing was saved. (error id ${body.errorId})`);
		expect(String(logged.mock.calls[0][0])).toBe(`[${body.errorId}] POST /farms/x`);
		vi.restoreAllMocks();
	});

	it('a form posted without form data gets a plain 415 message with its own code, not "internal"', async () => {
		const url = new URL('http://127.0.0.1/farms/x?/delete');
		const event = { url, request: new Request(url, { method: 'POST', body: '{}', headers: { 'content-type': 'application/json' } }) } as unknown as RequestEvent;
		const body = await handleError({ error: new Error('Form actions expect form-encoded data'), event, status: 415, message: 'Unsupported Media Type' });
		expect(body).toEqual({
			code: 'unsupported_media_type',
			message: 'This form must be sent as form data (application/x-www-form-urlencoded or multipart/form-data), but it was sent as application/json.'
		});
		const empty = { url, request: new Request(url, { method: 'POST' }) } as unknown as RequestEvent;
		expect((await handleError({ error: new Error('x'), event: empty, status: 415, message: 'Unsupported Media Type' }))!.message).toBe(
			'This form must be sent as form data (application/x-www-form-urlencoded or multipart/form-data), but it was sent with no body.'
		);
	});

	it('pageError turns a domain refusal into the same status for a page, and rethrows anything else', async () => {
		const { notFound } = await import('$lib/server/errors');
		const e = await thrown(() => pageError(notFound('field')));
		expect(e.status).toBe(404);
		expect(e.body).toEqual({ message: 'No field here: it does not exist, was deleted, or is not shared with you.', code: 'not_found' });
		const other = new TypeError('boom');
		expect(await thrown(() => pageError(other))).toBe(other);
	});
});
