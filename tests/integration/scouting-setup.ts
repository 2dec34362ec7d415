// Shared set-up for the scouting, photo and rainfall tests: a farm with one member per role, a
// field with an adopted 2026 plan, route handlers called as the server calls them, and photos made
// on the spot.
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import sharp from 'sharp';
import { createField } from '$lib/server/fields';
import { savePlan } from '$lib/server/plans';
import { requireMember } from '$lib/server/access';
import type { SessionUser } from '$lib/server/auth';
import type { LaneSpec } from '$lib/geometry/index';
import { makeFarmWithTeam } from './helpers';
import { rectangle } from '../fixtures/rectangle';

// Files go to a folder of this run, never the checkout's.
process.env.UPLOADS_DIR ??= mkdtempSync(join(tmpdir(), 'stripwright-uploads-'));

const cornSoy: LaneSpec[] = [
	{ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 },
	{ kind: 'crop', crop: 'soybean', rows: 8, rowSpacingIn: 30 }
];

/** A farm and a 650 × 1,320 ft field with 20-ft lanes (8 rows × 30 in) adopted for 2026. */
export async function farmWithPlan(season = 2026) {
	const { farm, members } = await makeFarmWithTeam();
	const access = await requireMember(fakeRequest(members.owner), farm.id, 'editPlans');
	const boundary = rectangle(650, 1320);
	const field = await createField(access, { name: 'Scouting test', boundary, exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
	const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
	const plan = await savePlan(access, field.id, season, { guidance: { a: sw, b: nw }, pattern: cornSoy, offsetFt: 0, headlandFt: 0, variant: 'main', assignments: [], notes: null, rebase: false, version: 0 });
	return { farm, members, field, plan, access };
}

function fakeRequest(user: SessionUser | null, path = '/api/test', init: RequestInit = {}) {
	const url = new URL(`http://127.0.0.1${path}`);
	return { locals: { user, session: null }, url, request: new Request(url, init) };
}

type Handler = (event: any) => Response | Promise<Response>;

/** Calls a route handler as SvelteKit would; answers status and parsed JSON (or raw bytes). */
export async function call(
	handler: Handler,
	user: SessionUser | null,
	params: Record<string, string>,
	opts: { method?: string; json?: unknown; form?: FormData; query?: string; headers?: Record<string, string>; body?: BodyInit } = {}
) {
	const path = `/api/x${opts.query ? `?${opts.query}` : ''}`;
	const init: RequestInit & { duplex?: string } = { method: opts.method ?? 'GET', headers: { ...(opts.headers ?? {}) } };
	if (opts.json !== undefined) {
		init.body = JSON.stringify(opts.json);
		(init.headers as Record<string, string>)['content-type'] = 'application/json';
	} else if (opts.form) init.body = opts.form;
	else if (opts.body !== undefined) {
		init.body = opts.body;
		init.duplex = 'half';
	}
	const event = { ...fakeRequest(user, path, init), params };
	const res = await handler(event);
	const type = res.headers.get('content-type') ?? '';
	const body = type.includes('json') ? await res.json() : res.status === 204 ? null : new Uint8Array(await res.arrayBuffer());
	return { status: res.status, body: body as any, headers: res.headers };
}

/** A JPEG photo carrying a camera make and a GPS position in its EXIF, like a phone's. */
export async function photoWithGps(width = 2400, height = 1800): Promise<Buffer> {
	return sharp({ create: { width, height, channels: 3, background: { r: 60, g: 120, b: 40 } } })
		.jpeg()
		.withExif({
			IFD0: { Make: 'FieldCam', Model: 'Test 1' },
			IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '43/1 54/1 0/1', GPSLongitudeRef: 'W', GPSLongitude: '94/1 12/1 36/1' }
		})
		.toBuffer();
}

export async function smallPng(): Promise<Buffer> {
	return sharp({ create: { width: 300, height: 200, channels: 4, background: { r: 200, g: 40, b: 40, alpha: 0.5 } } }).png().toBuffer();
}

export function photoForm(fields: Record<string, string>, files: { name: string; bytes: Uint8Array; type?: string }[]): FormData {
	const form = new FormData();
	for (const [k, v] of Object.entries(fields)) form.set(k, v);
	for (const f of files) form.append('photo', new File([Buffer.from(f.bytes)], f.name, { type: f.type ?? 'image/jpeg' }));
	return form;
}
