// Heavy geometry runs in worker threads under a time limit, so one big field never stalls others.
import type { Polygon, Position } from 'geojson';
import { afterAll, describe, expect, it } from 'vitest';
import { GeometryError, type LayoutInput } from '$lib/geometry/index';
import { AppError } from '$lib/server/errors';
import { GeometryPool, geometryWorkerPath } from '$lib/server/geometry-pool';
import { ImportError } from '$lib/server/field-import';

const origin: [number, number] = [-93.9, 44.1];

/** An oval of `n` positions, 0.008° of longitude (about 2,100 ft) across. */
function oval(n: number): Polygon {
	const ring: Position[] = [];
	for (let i = 0; i < n - 1; i++) {
		const a = (2 * Math.PI * i) / (n - 1);
		ring.push([origin[0] + 0.004 * Math.cos(a), origin[1] + 0.003 * Math.sin(a)]);
	}
	ring.push(ring[0]);
	return { type: 'Polygon', coordinates: [ring] };
}

// Within every limit, yet slow: 5,000 corners cut into ~4,200 half-foot lanes.
const huge: LayoutInput = { boundary: oval(5_000), guidance: { a: origin, b: [origin[0], origin[1] + 0.01] }, pattern: [{ kind: 'buffer', crop: 'grass', widthFt: 0.5 }] };
const small: LayoutInput = { ...huge, boundary: oval(40), pattern: [{ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 }] };

const pools: GeometryPool[] = [];
function pool(options: ConstructorParameters<typeof GeometryPool>[0] = {}) {
	const p = new GeometryPool({ threads: 2, ...options });
	pools.push(p);
	return p;
}
afterAll(async () => {
	await Promise.all(pools.map((p) => p.close()));
});

describe('geometry worker pool', () => {
	it('finds its worker entry from the source tree and from the built server alike', () => {
		const fromSource = geometryWorkerPath();
		expect(fromSource).toMatch(/\/src\/lib\/server\/geometry-worker\.mjs$/);
		const root = fromSource.slice(0, -'/src/lib/server/geometry-worker.mjs'.length);
		expect(geometryWorkerPath(`${root}/build/server/chunks/plans-abc123.js`)).toBe(fromSource);
	});

	it('answers a small layout while a huge one is still being cut', async () => {
		const p = pool({ taskTimeoutMs: 120_000 });
		// Both threads loaded first, so the order below is the work's, not the start-up's.
		await Promise.all([p.run({ kind: 'busy', ms: 300 }), p.run({ kind: 'busy', ms: 300 })]);
		const finished: string[] = [];
		const hugeDone = p.run({ kind: 'layout', input: huge }).then((layout) => {
			finished.push('huge');
			return layout;
		});
		const smallDone = p.run({ kind: 'layout', input: small }).then((layout) => {
			finished.push('small');
			return layout;
		});
		// The request thread itself stays free meanwhile: a timer set now runs before the huge layout ends.
		const tick = new Promise<void>((resolve) => setTimeout(() => {
			finished.push('timer');
			resolve();
		}, 20));
		const [bigLayout, smallLayout] = await Promise.all([hugeDone, smallDone, tick]);
		expect(finished).toEqual(expect.arrayContaining(['huge', 'small', 'timer']));
		expect(finished[finished.length - 1]).toBe('huge');
		expect(bigLayout.lanes.length).toBeGreaterThan(4_000);
		expect(smallLayout.lanes.length).toBe(106); // ~2,098 ft ÷ 20-ft lanes, plus the part lanes at both ends
	}, 120_000);

	it('stops a task over the time limit with a 503 that says the field is too complex, and keeps working', async () => {
		const p = pool({ taskTimeoutMs: 1_000 });
		await p.run({ kind: 'busy', ms: 1 });
		// A task that would run 20 s: only the limit can end it after 1 s, however fast the machine is.
		const e = await p.run({ kind: 'busy', ms: 20_000 }).catch((x: unknown) => x);
		expect(e).toBeInstanceOf(AppError);
		const err = e as AppError;
		expect(err.status).toBe(503);
		expect(err.code).toBe('too_complex');
		expect(err.message).toBe(
			'This task took longer than 1 s and was stopped: the field is too complex to work out at once. Simplify the outline (fewer corners), use wider lanes, or split the field.'
		);
		expect(err.headers).toEqual({ 'Retry-After': '30' });
		const after = await p.run({ kind: 'busy', ms: 1 });
		expect(after).toBeGreaterThan(0);
	}, 60_000);

	it('hands refusals back as the errors the code threw, with their codes', async () => {
		const p = pool();
		const bowtie: LayoutInput = { ...small, boundary: { type: 'Polygon', coordinates: [[[-94, 44], [-93.99, 44.01], [-93.99, 44], [-94, 44.01], [-94, 44]]] }, guidance: { a: [-94, 44], b: [-94, 44.01] } };
		const g = await p.run({ kind: 'layout', input: bowtie }).catch((x: unknown) => x);
		expect(g).toBeInstanceOf(GeometryError);
		expect((g as GeometryError).code).toBe('self-intersection');
		expect((g as GeometryError).where![0]).toBeCloseTo(-93.995, 6);
		const i = await p.run({ kind: 'import', filename: 'field.txt', bytes: new TextEncoder().encode('x') }).catch((x: unknown) => x);
		expect(i).toBeInstanceOf(ImportError);
		expect((i as ImportError).code).toBe('unsupported_format');
		expect((i as ImportError).status).toBe(400);
	}, 60_000);
});
