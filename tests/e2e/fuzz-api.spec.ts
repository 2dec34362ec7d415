// Property tests over every JSON API body: random JSON and valid bodies with one value swapped for
// nonsense, sent to every POST/PUT/PATCH route under /api (found from the route tree) on a farm
// this test makes for itself. Every answer is below 500 and in the one error shape when refused,
// and each comes back within a time bound. Counts of cases are printed.
import { expect, test } from '@playwright/test';
import fc from 'fast-check';
import { randomUUID } from 'node:crypto';
import { discoverRoutes } from './permission-matrix';
import { CORN_8, SOYBEAN_8, PASTURE_10, eightyAcres, ownFarm, ownField, ownPlan } from './own-farm';

const CASE_MS = 8000;

/** Valid bodies for the main routes; the fuzzer swaps one value at a time for anything at all. */
function validBodies(ids: Record<string, string>, guidance: { a: [number, number]; b: [number, number] }, boundary: object): Record<string, Record<string, unknown>> {
	const now = Date.now();
	return {
		'/api/farms/[farmId]/fields': { name: 'Fuzz field', boundary },
		'/api/farms/[farmId]/fields/[fieldId]': { name: 'Renamed', version: 1 },
		'/api/farms/[farmId]/fields/[fieldId]/plans/[season]': { guidance, pattern: [CORN_8, SOYBEAN_8], offsetFt: 0, headlandFt: 0, version: 0, variant: 'fuzz' },
		'/api/farms/[farmId]/fields/[fieldId]/plans/[season]/next': { shiftFt: 20 },
		'/api/layout-preview': { boundary, guidance, pattern: [CORN_8, SOYBEAN_8], offsetFt: 0, headlandFt: 30 },
		'/api/farms/[farmId]/products': { name: `P ${randomUUID().slice(0, 6)}`, kind: 'herbicide', unit: 'pt', epaRegNo: '1234-56', restrictedUse: false, reiHours: 12, phiDays: 30, grazingDays: 7 },
		'/api/farms/[farmId]/varieties': { crop: 'corn', name: `V ${randomUUID().slice(0, 6)}`, relativeMaturity: 100, seedsPerUnit: 80000 },
		'/api/farms/[farmId]/fields/[fieldId]/seasons/[season]/records': {
			type: 'spraying', startedAt: new Date(now - 7_200_000).toISOString(), endedAt: new Date(now - 3_600_000).toISOString(), laneIndexes: [0, 1],
			products: [{ productId: ids.productId, rate: 1.5, rateUnit: 'pt/ac' }], applicator: 'Test applicator', applicatorCertNumber: 'C-1', weather: { tempF: 70, windMph: 5, windFrom: 'S' }
		},
		'/api/farms/[farmId]/fields/[fieldId]/seasons/[season]/harvest': { laneIndexes: [0], crop: 'corn', wetWeightLb: 20000, moisturePct: 18 },
		'/api/farms/[farmId]/livestock/groups': { name: 'Fuzz flock', species: 'sheep', head: 20, averageWeightLb: 150 },
		'/api/farms/[farmId]/livestock/moves': { groupId: ids.groupId, fieldId: ids.fieldId, season: 2026, laneIndex: 2, from: '2026-06-01', to: '2026-06-05' },
		'/api/farms/[farmId]/tours': { title: 'Field day', date: '2026-07-15', expiresAt: new Date(now + 86_400_000).toISOString(), fieldIds: [ids.fieldId], stops: [{ lng: guidance.a[0], lat: guidance.a[1], title: 'Stop', note: 'Look' }] }
	};
}

test('no JSON body makes any API route fail on our side or hang', async ({ page, baseURL }) => {
	test.setTimeout(600_000);
	const own = await ownFarm(page, 'fuzzer');
	const request = page.request;
	const { boundary, guidance } = eightyAcres(-94.41, 43.61);
	const fieldId = await ownField(request, own.farmId, 'Fuzz 80', boundary);
	await ownPlan(request, own.farmId, fieldId, 2026, { guidance, pattern: [CORN_8, SOYBEAN_8, PASTURE_10], offsetFt: 0, headlandFt: 0 });
	const product = await request.post(`/api/farms/${own.farmId}/products`, { data: { name: 'Fuzz herbicide', kind: 'herbicide', unit: 'pt' } });
	expect(product.status()).toBe(201);
	const group = await request.post(`/api/farms/${own.farmId}/livestock/groups`, { data: { name: 'Fuzz group', species: 'sheep', head: 10, averageWeightLb: 150 } });
	expect(group.status()).toBe(201);
	const ids: Record<string, string> = { farmId: own.farmId, fieldId, season: '2026', productId: (await product.json()).id, groupId: (await group.json()).id };
	const valid = validBodies(ids, guidance, boundary);

	const routes = discoverRoutes().filter((r) => r.path.startsWith('/api/') && ['POST', 'PUT', 'PATCH'].includes(r.method) && r.path !== '/api/session');
	const fill = (id: string) => id.replace(/\[(\w+)\]/g, (_, n: string) => ids[n] ?? randomUUID());
	const counts: Record<string, number> = {};
	const failures: string[] = [];

	async function send(method: string, routeId: string, body: unknown) {
		const started = Date.now();
		const res = await request.fetch(fill(routeId), { method, data: body === undefined ? undefined : JSON.stringify(body), headers: { 'content-type': 'application/json' }, failOnStatusCode: false });
		const ms = Date.now() - started;
		counts[routeId] = (counts[routeId] ?? 0) + 1;
		const status = res.status();
		if (status >= 500) failures.push(`${method} ${routeId} answered ${status} to ${JSON.stringify(body).slice(0, 200)}`);
		else if (status >= 400) {
			const json = await res.json().catch(() => null);
			if (typeof json?.error?.code !== 'string' || typeof json?.error?.message !== 'string') failures.push(`${method} ${routeId} answered ${status} without the error shape`);
		}
		if (ms > CASE_MS) failures.push(`${method} ${routeId} took ${ms} ms`);
	}

	const anyJson = fc.oneof(fc.jsonValue({ maxDepth: 3 }), fc.constantFrom(null, [], {}, '', 0, -1, 1e308, 'x'.repeat(5000)));
	for (const route of routes) {
		await fc.assert(fc.asyncProperty(anyJson, async (body) => send(route.method, route.path, body)), { numRuns: 20 });
		const template = valid[route.path];
		if (!template) continue;
		const keys = Object.keys(template);
		const swapped = fc.tuple(fc.constantFrom(...keys), fc.oneof(fc.jsonValue({ maxDepth: 2 }), fc.constantFrom(null, -1, 0, 1e308, -1e308, '', 'x'.repeat(3000), [], {}, '2026-02-30', 'NaN')))
			.map(([k, v]) => ({ ...template, [k]: v }));
		await fc.assert(fc.asyncProperty(swapped, async (body) => send(route.method, route.path, body)), { numRuns: 40 });
	}
	const total = Object.values(counts).reduce((a, b) => a + b, 0);
	console.log(`fuzzed JSON API: ${routes.length} routes, ${total} bodies`);
	expect(failures).toEqual([]);
	expect(total).toBeGreaterThan(routes.length * 20 - 1);
});
