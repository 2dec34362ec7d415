// Bad input answers 400, 404, 413 or 415 with a message saying what is wrong, never a 500: against
// the built app, with a farm and a stranger's farm made for this spec.
import { expect, test, type APIRequestContext, type Browser, type BrowserContext, type Page } from '@playwright/test';
import http from 'node:http';
import { CORN_8, SOYBEAN_8, eightyAcres, ownFarm, ownField, ownPlan, type OwnFarm } from './own-farm';

test.describe.configure({ mode: 'serial' });

let mine: OwnFarm & { context: BrowserContext; page: Page; request: APIRequestContext; fieldId: string };
let theirs: OwnFarm & { context: BrowserContext; request: APIRequestContext; fieldId: string };
const UNKNOWN = '0b9c3a52-6f1e-4c3d-9a7b-2d4e5f607182';
const NOT_IDS = ['a'.repeat(36), '-'.repeat(36), 'zzzzzzzz-zzzz-zzzz-zzzz-zzzzzzzzzzzz'];
const NUL_TEXT = 'Contains a NUL character (\\u0000), which text may not hold.';

async function farmFor(browser: Browser, tag: string, lng: number) {
	const context = await browser.newContext();
	const page = await context.newPage();
	const farm = await ownFarm(page, tag);
	const { boundary, guidance } = eightyAcres(lng, 43.71);
	const fieldId = await ownField(page.request, farm.farmId, `${tag} field`, boundary);
	return { ...farm, context, page, request: page.request, fieldId, guidance };
}

test.beforeAll(async ({ browser }) => {
	test.setTimeout(120_000);
	const a = await farmFor(browser, 'bad-input', -94.31);
	for (const season of [2025, 2026]) {
		await ownPlan(a.request, a.farmId, a.fieldId, season, { guidance: a.guidance as never, pattern: season === 2025 ? [CORN_8, SOYBEAN_8] : [SOYBEAN_8, CORN_8], offsetFt: 0, headlandFt: 30 });
	}
	mine = a;
	theirs = await farmFor(browser, 'stranger', -94.2);
});

test.afterAll(async () => {
	await mine?.context.close();
	await theirs?.context.close();
});

const fieldUrl = () => `/farms/${mine.farmId}/fields/${mine.fieldId}`;
const apiField = () => `/api/farms/${mine.farmId}/fields/${mine.fieldId}`;
const html = { accept: 'text/html' };

test('a NUL character in the address (?variant=%00, or in the path) is a 400 saying where', async ({ baseURL }) => {
	const api = await mine.request.get(`${apiField()}/plans/2025?variant=%00`);
	expect(api.status()).toBe(400);
	expect(await api.json()).toEqual({
		error: { code: 'invalid', message: 'The address contains a NUL character (%00) in the query parameter "variant"; remove it and try again.' }
	});
	const inPath = await mine.request.get(`/api/farms/${mine.farmId}/fields/north%0080`);
	expect(inPath.status()).toBe(400);
	expect((await inPath.json()).error.message).toBe('The address contains a NUL character (%00) in the path; remove it and try again.');

	const response = await mine.page.goto(`${baseURL}${fieldUrl()}/plans/2025?variant=%00`);
	expect(response!.status()).toBe(400);
	await expect(mine.page.getByRole('heading', { level: 1 })).toHaveText('The address contains a NUL character (%00) in the query parameter "variant"; remove it and try again.');
});

test('a NUL character in a JSON body is a 400 naming the field, and nothing is saved', async () => {
	const before = (await (await mine.request.get(apiField())).json()) as { name: string; version: number };
	const patch = await mine.request.patch(apiField(), { data: { name: 'North\u000080', version: before.version } });
	expect(patch.status()).toBe(400);
	expect(await patch.json()).toEqual({
		error: { code: 'invalid', message: 'A text value contains a NUL character (\\u0000) at name; remove it and try again.', fields: { name: [NUL_TEXT] } }
	});
	const { boundary } = eightyAcres(-94.25, 43.71);
	const created = await mine.request.post(`/api/farms/${mine.farmId}/fields`, { data: { name: 'ok', notes: 'line one\u0000', boundary } });
	expect(created.status()).toBe(400);
	expect((await created.json()).error.fields).toEqual({ notes: [NUL_TEXT] });

	const after = (await (await mine.request.get(apiField())).json()) as { name: string; version: number };
	expect(after.name).toBe(before.name);
	expect(after.version).toBe(before.version);
	const list = (await (await mine.request.get(`/api/farms/${mine.farmId}/fields`)).json()) as { id: string }[];
	expect(list.map((f) => f.id)).toEqual([mine.fieldId]);
});

test('a NUL character in a form field is a 400, posted plainly or by the page script as multipart', async ({ baseURL }) => {
	const origin = new URL(baseURL!).origin;
	const plain = await mine.request.post(`${fieldUrl()}/edit`, { form: { name: 'Renamed\u0000', version: '1' }, headers: { ...html, origin } });
	expect(plain.status()).toBe(400);
	expect(await plain.text()).toContain('<h1>The form field "name" contains a NUL character (\\u0000); remove it and try again.</h1>');

	const enhanced = await mine.request.post(`${fieldUrl()}/edit`, {
		multipart: { name: 'Renamed', notes: 'tab\u0000here', version: '1' },
		headers: { accept: 'application/json', 'x-sveltekit-action': 'true', origin }
	});
	expect(enhanced.status()).toBe(400);
	expect(await enhanced.json()).toEqual({
		type: 'error',
		error: { code: 'invalid', message: 'The form field "notes" contains a NUL character (\\u0000); remove it and try again.' }
	});
	const field = (await (await mine.request.get(apiField())).json()) as { name: string; notes: string | null };
	expect(field.name).toBe('bad-input field');
	expect(field.notes).toBeNull();
});

test('36-character ids that are not UUIDs, and seasons that are not years, are 404s on API and pages', async () => {
	for (const bad of NOT_IDS) {
		const api = await mine.request.get(`/api/farms/${mine.farmId}/fields/${bad}`);
		expect(api.status(), bad).toBe(404);
		expect(await api.json()).toEqual({ error: { code: 'not_found', message: 'No field here: the field id in the address is not a valid id.' } });
		expect((await mine.request.patch(`/api/farms/${mine.farmId}/fields/${bad}`, { data: { name: 'x' } })).status()).toBe(404);
		expect((await mine.request.get(`/api/farms/${bad}/fields`)).status()).toBe(404);
		expect((await mine.request.get(`/farms/${mine.farmId}/fields/${bad}`, { headers: html })).status()).toBe(404);
		expect((await mine.request.get(`/farms/${mine.farmId}/equipment/${bad}`, { headers: html })).status()).toBe(404);
		const planter = await mine.request.get(`${apiField()}/plans/2025/sheet.pdf?planter=${bad}`);
		expect(planter.status()).toBe(404);
		expect((await planter.json()).error.code).toBe('not_found');
	}
	const season = await mine.request.get(`${apiField()}/plans/20x5`);
	expect(season.status()).toBe(404);
	expect(await season.json()).toEqual({ error: { code: 'not_found', message: 'No plan here: the season in the address is not a year such as 2025.' } });
	const nowhere = await mine.request.get('/api/no-such-thing');
	expect(nowhere.status()).toBe(404);
	expect(await nowhere.json()).toEqual({ error: { code: 'not_found', message: 'There is no API at /api/no-such-thing.' } });
});

test('compare with ?a=abc, 1e20 or 2027.5 is a 400 page saying what a season looks like', async ({ baseURL }) => {
	for (const a of ['abc', '1e20', '2027.5']) {
		const response = await mine.page.goto(`${baseURL}${fieldUrl()}/compare?a=${a}&b=2026`);
		expect(response!.status(), a).toBe(400);
		await expect(mine.page.getByText(`The season to compare (?a=) must be a year such as 2025, not "${a}".`, { exact: true })).toBeVisible();
	}
	const b = await mine.page.goto(`${baseURL}${fieldUrl()}/compare?a=2025&b=1e20`);
	expect(b!.status()).toBe(400);
	const fine = await mine.page.goto(`${baseURL}${fieldUrl()}/compare?a=2025&b=2026`);
	expect(fine!.status()).toBe(200);
});

test("form actions on unknown ids or another farm's ids answer 404 and change nothing", async ({ baseURL }) => {
	const origin = new URL(baseURL!).origin;
	const post = (path: string, form: Record<string, string> = {}) => mine.request.post(path, { form, headers: { ...html, origin }, maxRedirects: 0 });
	const settings = JSON.stringify({ guidance: mine.fieldId, pattern: [CORN_8], offsetFt: 0, headlandFt: 30, version: 0 });
	const targets = [
		{ farm: mine.farmId, field: UNKNOWN },
		{ farm: mine.farmId, field: theirs.fieldId },
		{ farm: theirs.farmId, field: theirs.fieldId }
	];
	for (const { farm, field } of targets) {
		const where = `/farms/${farm}/fields/${field}`;
		expect((await post(`${where}?/delete`, { confirm: 'yes' })).status(), `${where} delete`).toBe(404);
		expect((await post(`${where}/edit`, { name: 'Taken over', version: '1' })).status(), `${where} edit`).toBe(404);
		expect((await post(`${where}/plans/2025?/save`, { settings })).status(), `${where} save`).toBe(404);
		expect((await post(`${where}/plans/2025?/adopt`, { variant: 'B' })).status(), `${where} adopt`).toBe(404);
		expect((await post(`${where}/plans/2025/sheet?/email`, { to: mine.email })).status(), `${where} email`).toBe(404);
	}
	expect((await post(`/farms/${mine.farmId}/equipment/${UNKNOWN}?/delete`)).status()).toBe(404);
	const stillThere = await theirs.request.get(`/api/farms/${theirs.farmId}/fields/${theirs.fieldId}`);
	expect(stillThere.status()).toBe(200);
	expect((await stillThere.json()).name).toBe('stranger field');
});

test('a form action posted with no body, or as JSON, is a 415 with a plain message, not "internal"', async ({ baseURL }) => {
	const origin = new URL(baseURL!).origin;
	const empty = await mine.request.post(`${fieldUrl()}?/delete`, { headers: { accept: 'application/json', origin } });
	expect(empty.status()).toBe(415);
	expect(await empty.json()).toEqual({
		type: 'error',
		error: {
			code: 'unsupported_media_type',
			message: 'This form must be sent as form data (application/x-www-form-urlencoded or multipart/form-data), but it was sent with no body.'
		}
	});
	const asJson = await mine.request.post(`${fieldUrl()}?/delete`, { data: { confirm: true }, headers: { accept: 'application/json', origin } });
	expect(asJson.status()).toBe(415);
	expect((await asJson.json()).error.message).toBe(
		'This form must be sent as form data (application/x-www-form-urlencoded or multipart/form-data), but it was sent as application/json.'
	);
	const page = await mine.request.post(`${fieldUrl()}?/delete`, { headers: { ...html, origin } });
	expect(page.status()).toBe(415);
	expect(await page.text()).toContain('This form must be sent as form data');
	expect((await mine.request.get(apiField())).status()).toBe(200);
});

/** Streams a multipart upload of `fileBytes` with Transfer-Encoding: chunked (no Content-Length). */
async function chunkedUpload(url: string, headers: Record<string, string>, fileBytes: number): Promise<{ status: number; body: string; sentBytes: number }> {
	const boundary = 'bad-input-upload';
	return new Promise((resolve, reject) => {
		let answered = false;
		let sentBytes = 0;
		const req = http.request(url, { method: 'POST', headers: { ...headers, 'content-type': `multipart/form-data; boundary=${boundary}`, 'transfer-encoding': 'chunked' } });
		req.on('response', (res) => {
			answered = true;
			let body = '';
			res.setEncoding('utf8');
			res.on('data', (d) => (body += d));
			res.on('end', () => {
				resolve({ status: res.statusCode!, body, sentBytes });
				req.destroy();
			});
		});
		req.on('error', (e) => {
			if (!answered) reject(e);
		});
		req.write(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="huge.geojson"\r\nContent-Type: application/geo+json\r\n\r\n`);
		const piece = Buffer.alloc(256 * 1024, 0x20);
		const pump = () => {
			while (!answered && sentBytes < fileBytes) {
				sentBytes += piece.length;
				if (!req.write(piece)) return void req.once('drain', pump);
			}
			if (!answered) req.end(`\r\n--${boundary}--\r\n`);
		};
		pump();
	});
}

test('a 50 MB chunked upload to the import routes is a 413, not a 400', async ({ baseURL }) => {
	const origin = new URL(baseURL!).origin;
	const cookie = (await mine.context.cookies()).map((c) => `${c.name}=${c.value}`).join('; ');
	const api = await chunkedUpload(`${origin}/api/farms/${mine.farmId}/fields/import`, { cookie, origin, accept: 'application/json' }, 50 * 1024 * 1024);
	expect(api.status).toBe(413);
	const message = 'The file is larger than the limit: uploads are limited to 10.0 MB.';
	expect(JSON.parse(api.body)).toEqual({ error: { code: 'too_large', message, fields: { file: [message] } } });
	expect(api.sentBytes).toBeLessThan(50 * 1024 * 1024);

	const page = await chunkedUpload(`${origin}/farms/${mine.farmId}/fields/import?/read`, { cookie, origin, accept: 'text/html' }, 50 * 1024 * 1024);
	expect(page.status).toBe(413);
	expect(page.body).toContain(message);
});

test('deeply nested bodies and files are refused in plain words, never "Maximum call stack size exceeded"', async ({ baseURL }) => {
	const deep = '['.repeat(100_000) + ']'.repeat(100_000);
	const preview = await mine.request.post('/api/layout-preview', { data: `{"pattern": ${deep}}`, headers: { 'content-type': 'application/json' } });
	expect(preview.status()).toBe(400);
	const body = await preview.json();
	expect(body.error.code).toBe('too_deeply_nested');
	expect(body.error.message).toBe('The request body is too deeply nested (more than 32 levels of arrays and objects).');

	const depth = 20_000;
	const geojson = `{"type":"Feature","properties":{},"geometry":${'{"type":"GeometryCollection","geometries":['.repeat(depth)}{"type":"Polygon","coordinates":[[[0,0],[1,0],[1,1],[0,0]]]}${']}'.repeat(depth)}}`;
	const upload = await mine.request.post(`/api/farms/${mine.farmId}/fields/import`, {
		multipart: { file: { name: 'deep.geojson', mimeType: 'application/geo+json', buffer: Buffer.from(geojson) } },
		headers: { origin: new URL(baseURL!).origin }
	});
	expect(upload.status()).toBe(400);
	const refused = await upload.json();
	expect(refused.error.message).toBe('The file could not be read as GeoJSON: it is nested too deeply or is too large to read.');
	expect(JSON.stringify(refused)).not.toContain('call stack');
});
