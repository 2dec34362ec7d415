// The product's permission matrix, route by route, and the route tree it is checked against.
// Roles and capabilities: owner, manager, crew, advisor, viewer (src/lib/permissions.ts).
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';

export type Capability = 'manageFarm' | 'editPlans' | 'logRecords' | 'scout' | 'read';
export type Caller = 'anonymous' | 'outsider' | 'owner' | 'manager' | 'crew' | 'advisor' | 'viewer';
export type Outcome = 'ok' | 'sign-in' | 'forbidden' | 'not-found' | 'error';

/**
 * public: anyone, signed in or not. signedIn: any account. notFoundForAll: answers 404 to every
 * caller for the made-up token the test sends (share links). never: not called by the matrix
 * (it would end the caller's own session). A capability: members of the farm whose role holds it;
 * `field` adds the viewer's field grant (the test's field, North 80, is not granted to the demo viewer).
 */
export type Rule = 'public' | 'signedIn' | 'notFoundForAll' | 'never' | { cap: Capability; field?: boolean };

const ROLE_CAPS: Record<Exclude<Caller, 'anonymous' | 'outsider'>, Capability[]> = {
	owner: ['manageFarm', 'editPlans', 'logRecords', 'scout', 'read'],
	manager: ['editPlans', 'logRecords', 'scout', 'read'],
	crew: ['logRecords', 'scout', 'read'],
	advisor: ['scout', 'read'],
	viewer: ['read']
};

/** What a caller must get; 'skip' for allowed writes (the matrix never changes the demo). */
export function expectedOutcome(rule: Rule, caller: Caller, method: string): Outcome | 'skip' {
	const write = method !== 'GET';
	if (rule === 'never') return 'skip';
	if (rule === 'notFoundForAll') return 'not-found';
	if (rule === 'public') return write ? 'skip' : 'ok';
	if (caller === 'anonymous') return 'sign-in';
	if (rule === 'signedIn') return write ? 'skip' : 'ok';
	if (caller === 'outsider') return 'not-found';
	if (!ROLE_CAPS[caller].includes(rule.cap)) return 'forbidden';
	if (rule.field && caller === 'viewer') return 'not-found';
	return write ? 'skip' : 'ok';
}

export interface RouteMethod {
	/** "GET /api/farms/[farmId]/fields", "POST /farms/[farmId]/team?/invite" */
	key: string;
	method: string;
	/** The address with its parameters, and ?/action for form actions. */
	path: string;
}

const ROUTES_DIR = join(process.cwd(), 'src', 'routes');

function walk(dir: string): string[] {
	return readdirSync(dir).flatMap((name) => {
		const p = join(dir, name);
		return statSync(p).isDirectory() ? walk(p) : [p];
	});
}

function routeId(file: string): string {
	const dir = relative(ROUTES_DIR, join(file, '..'));
	const parts = dir.split('/').filter((p) => p && !/^\(.*\)$/.test(p));
	return '/' + parts.join('/');
}

/** Action names of a +page.server.ts: the keys of its exported `actions` object. */
function actionNames(source: string): string[] {
	const start = source.search(/export const actions\b/);
	if (start < 0) return [];
	const block = source.slice(start, source.indexOf('\n};', start));
	return [...block.matchAll(/^\t(?:async\s+)?([A-Za-z_]\w*)\s*(?::|\()/gm)].map((m) => m[1]);
}

/** Every page (GET), form action (POST ?/name) and endpoint method under src/routes. */
export function discoverRoutes(): RouteMethod[] {
	const out: RouteMethod[] = [];
	for (const file of walk(ROUTES_DIR)) {
		const name = file.split('/').pop()!;
		const id = routeId(file);
		if (name === '+server.ts') {
			const source = readFileSync(file, 'utf8');
			for (const m of source.matchAll(/export (?:const|async function|function) (GET|POST|PUT|PATCH|DELETE)\b/g)) {
				out.push({ key: `${m[1]} ${id}`, method: m[1], path: id });
			}
		} else if (name === '+page.svelte') {
			out.push({ key: `GET ${id}`, method: 'GET', path: id });
		} else if (name === '+page.server.ts') {
			for (const action of actionNames(readFileSync(file, 'utf8'))) {
				const suffix = action === 'default' ? '' : `?/${action}`;
				out.push({ key: `POST ${id}${suffix}`, method: 'POST', path: `${id}${suffix}` });
			}
		}
	}
	return out.sort((a, b) => a.key.localeCompare(b.key));
}

const read: Rule = { cap: 'read' };
const readField: Rule = { cap: 'read', field: true };
const editPlans: Rule = { cap: 'editPlans' };
const editField: Rule = { cap: 'editPlans', field: true };
const logRecords: Rule = { cap: 'logRecords', field: true };
const logFarm: Rule = { cap: 'logRecords' };
const scout: Rule = { cap: 'scout', field: true };
const manageFarm: Rule = { cap: 'manageFarm' };

export const RULES: Record<string, Rule> = {};
