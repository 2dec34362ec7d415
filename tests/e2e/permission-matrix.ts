// The product's permission matrix, route by route, and the route tree it is checked against.
// Roles and capabilities: owner, manager, crew, advisor, viewer (src/lib/permissions.ts).
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';

export type Capability = 'manageFarm' | 'editPlans' | 'logRecords' | 'scout' | 'read';
export type Role = 'owner' | 'manager' | 'crew' | 'advisor' | 'viewer';
/**
 * Who calls. The five roles are members of the demo farm; `viewer` reads a field granted to it,
 * `viewerNoGrant` is the same viewer on a field it was not granted, and `viewerCrossField` sends the
 * granted field's id with rows of a field it was not granted; `ownerCrossField` is the owner doing
 * the same (one field's id beside another field's row must not reach that row). `outsider` is signed in with a
 * farm of its own and sends the demo farm's ids; `outsiderCrossFarm` is the same account sending
 * its own farm id with the demo farm's row ids. `visitor` holds a working share link and no
 * session; `anonymous` holds nothing.
 */
export type Caller = 'anonymous' | 'visitor' | 'outsider' | 'outsiderCrossFarm' | Role | 'viewerNoGrant' | 'viewerCrossField' | 'ownerCrossField';
export const CALLERS: Caller[] = ['owner', 'ownerCrossField', 'manager', 'crew', 'advisor', 'viewer', 'viewerNoGrant', 'viewerCrossField', 'outsider', 'outsiderCrossFarm', 'visitor', 'anonymous'];
export type Outcome = 'ok' | 'redirect' | 'sign-in' | 'forbidden' | 'not-found' | 'invalid' | 'error' | 'other';

/**
 * public: anyone, signed in or not. signedIn: any account. shareLink: a visitor's tour link; the
 * real token opens for anyone without a session, a made-up one answers 404 to everyone.
 * notFoundForAll: answers 404 to every caller for the made-up values the test sends. never: not
 * called by the matrix (it would end the caller's own session).
 * A capability: members of the farm whose role holds it. `field`: the row belongs to one field, so
 * a viewer not granted that field gets 404. `viewerHidden`: viewers see it only if the owner chose
 * to show it to them (the demo farm does not), else 404.
 */
export type Rule =
	| 'public'
	| 'signedIn'
	| 'shareLink'
	| 'notFoundForAll'
	| 'never'
	| { cap: Capability; field?: boolean; viewerHidden?: boolean };

export const ROLE_CAPS: Record<Role, Capability[]> = {
	owner: ['manageFarm', 'editPlans', 'logRecords', 'scout', 'read'],
	manager: ['editPlans', 'logRecords', 'scout', 'read'],
	crew: ['logRecords', 'scout', 'read'],
	advisor: ['scout', 'read'],
	viewer: ['read']
};

/** Whether the matrix sends this route (its path and any query template) for this caller at all. */
export function applies(rule: Rule, caller: Caller, routePath: string): boolean {
	if (rule === 'never') return false;
	// The ungranted viewer differs from the viewer only where a row belongs to a field.
	if (caller === 'viewerNoGrant') return typeof rule === 'object' && rule.field === true;
	// A granted field in the path must not open another field's row named beside it.
	if (caller === 'viewerCrossField' || caller === 'ownerCrossField') {
		return typeof rule === 'object' && rule.field === true && /\[fieldId\].*\[(?!season\])\w+\]/.test(routePath);
	}
	// Another farm's row ids under the outsider's own farm id: only routes that name a row.
	if (caller === 'outsiderCrossFarm') return typeof rule === 'object' && /\[(?!farmId\]|season\])\w+\]/.test(routePath);
	return true;
}

/** What a caller must get; 'skip' for allowed writes (the matrix never changes the demo). */
export function expectedOutcome(rule: Rule, caller: Caller, method: string): Outcome | 'skip' {
	const write = method !== 'GET';
	if (rule === 'never') return 'skip';
	if (rule === 'notFoundForAll') return 'not-found';
	if (rule === 'shareLink') return caller === 'visitor' ? (write ? 'skip' : 'ok') : 'not-found';
	if (rule === 'public') return write ? 'skip' : 'ok';
	if (caller === 'anonymous' || caller === 'visitor') return 'sign-in';
	if (rule === 'signedIn') return write ? 'skip' : 'ok';
	if (caller === 'outsider' || caller === 'outsiderCrossFarm' || caller === 'ownerCrossField') return 'not-found';
	const role: Role = caller === 'viewerNoGrant' || caller === 'viewerCrossField' ? 'viewer' : caller;
	if (!ROLE_CAPS[role].includes(rule.cap)) return 'forbidden';
	if (rule.viewerHidden && role === 'viewer') return 'not-found';
	if (rule.field && (caller === 'viewerNoGrant' || caller === 'viewerCrossField')) return 'not-found';
	return write ? 'skip' : 'ok';
}

/** Allowed reads whose answer is a redirect (other than to the sign-in page), and where it leads. */
export const REDIRECTING_READS: Record<string, RegExp> = {
	// Signed in, the front page and the sign-in and sign-up pages lead on to one's farms.
	'GET /': /^\/farms$/,
	'GET /sign-in': /^\/farms$/,
	'GET /sign-up': /^\/farms$/,
	// Signing out is a form post; opening its address only leads home.
	'GET /sign-out': /^\/$/,
	'GET /farms/switch': /^\/farms\/[0-9a-f-]{36}$/
};

/**
 * Whether what came back is what the rule asks. One allowance: a write naming a row under the wrong
 * farm or field (the cross callers) may be refused as bad input (400) before the row is looked up,
 * which reveals nothing either; it must never succeed, be forbidden or fail.
 */
export function satisfies(expected: Outcome, got: Outcome, caller: Caller, route: RouteMethod, location = ''): boolean {
	if (got === expected) return true;
	const method = route.method;
	// A page that sends its reader on elsewhere must say so here: a refusal must not hide as a redirect.
	if (expected === 'ok' && got === 'redirect') return REDIRECTING_READS[route.key]?.test(location) ?? false;
	return (caller === 'outsiderCrossFarm' || caller === 'ownerCrossField') && method !== 'GET' && expected === 'not-found' && got === 'invalid';
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
			const source = readFileSync(file, 'utf8');
			// A load with no page of its own (it only redirects) is still an address one can open.
			if (/export const load\b/.test(source) && !existsSync(join(file, '..', '+page.svelte'))) {
				out.push({ key: `GET ${id}`, method: 'GET', path: id });
			}
			for (const action of actionNames(source)) {
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

/**
 * The product's roles table, route by route: manage members and settings (owner); edit fields,
 * plans, equipment, products and share links (owner, manager); log operations, grazing moves,
 * rainfall and harvest (and crew); add scouting notes and photos (and advisor); read plans, sheets,
 * records and reports (everyone, viewers only the fields granted). A route missing here fails the
 * matrix test, so a new route cannot ship without its rule.
 */
export const RULES: Record<string, Rule> = {
	// Signing in and out, accounts, links that come by e-mail.
	'GET /': 'public',
	'GET /health': 'public',
	'GET /sign-in': 'public',
	'POST /sign-in': 'public',
	'GET /sign-up': 'public',
	'POST /sign-up': 'public',
	'GET /sign-up/confirm/[token]': 'public',
	'POST /sign-up/confirm/[token]': 'public',
	'GET /forgot-password': 'public',
	'POST /forgot-password': 'public',
	'GET /reset-password/[token]': 'public',
	'POST /reset-password/[token]': 'public',
	'GET /invitations/[token]': 'public',
	'POST /invitations/[token]?/accept': 'signedIn',
	'GET /sign-out': 'public',
	'POST /sign-out': 'never',
	'POST /api/session': 'public',
	'DELETE /api/session': 'never',
	'GET /account': 'signedIn',
	'POST /account?/password': 'signedIn',
	'GET /api/farms': 'signedIn',
	'GET /farms': 'signedIn',
	'POST /farms?/create': 'signedIn',
	'GET /farms/switch': read,
	'POST /api/layout-preview': 'signedIn',
	// The stand-in mailbox exists only where MAILBOX_URL is set (development and tests).
	'GET /dev/mailbox': 'signedIn',

	// The visitor's tour link.
	'GET /share/[token]': 'shareLink',
	'GET /share/[token]/print': 'shareLink',
	// The demo tour has no stop photos: every photo address answers 404, with a real link or not.
	'GET /share/[token]/photos/[photo]': 'notFoundForAll',

	// Farm pages.
	'GET /farms/[farmId]': read,
	'GET /farms/[farmId]/team': read,
	'POST /farms/[farmId]/team?/invite': manageFarm,
	'POST /farms/[farmId]/team?/changeRole': manageFarm,
	'POST /farms/[farmId]/team?/remove': manageFarm,
	'POST /farms/[farmId]/team?/grantFields': manageFarm,
	'POST /farms/[farmId]/team?/revoke': manageFarm,
	'POST /farms/[farmId]/team?/leave': read,
	'GET /farms/[farmId]/settings': manageFarm,
	'POST /farms/[farmId]/settings?/rename': manageFarm,
	'POST /farms/[farmId]/settings?/privacy': manageFarm,
	'POST /farms/[farmId]/settings?/delete': manageFarm,
	'POST /farms/[farmId]/settings?/units': manageFarm,
	'POST /farms/[farmId]/settings?/timeZone': manageFarm,
	'GET /farms/[farmId]/planning': read,
	'POST /farms/[farmId]/planning?/planAll': editPlans,
	'GET /farms/[farmId]/needs': read,
	'GET /farms/[farmId]/records': read,
	'GET /farms/[farmId]/harvest': read,
	'GET /farms/[farmId]/reports': read,
	'GET /farms/[farmId]/reports/landlord/[fieldId]': readField,

	// Fields, plans and sheets.
	'GET /farms/[farmId]/fields': read,
	'GET /farms/[farmId]/fields/new': editPlans,
	'POST /farms/[farmId]/fields/new': editPlans,
	'GET /farms/[farmId]/fields/import': editPlans,
	'POST /farms/[farmId]/fields/import?/read': editPlans,
	'POST /farms/[farmId]/fields/import?/create': editPlans,
	'GET /farms/[farmId]/fields/[fieldId]': readField,
	'POST /farms/[farmId]/fields/[fieldId]?/delete': editField,
	'GET /farms/[farmId]/fields/[fieldId]/edit': editField,
	'POST /farms/[farmId]/fields/[fieldId]/edit': editField,
	'GET /farms/[farmId]/fields/[fieldId]/compare': readField,
	'GET /farms/[farmId]/fields/[fieldId]/plans/[season]': readField,
	'POST /farms/[farmId]/fields/[fieldId]/plans/[season]?/save': editField,
	'POST /farms/[farmId]/fields/[fieldId]/plans/[season]?/adopt': editField,
	'POST /farms/[farmId]/fields/[fieldId]/plans/[season]?/deleteVariant': editField,
	'GET /farms/[farmId]/fields/[fieldId]/plans/[season]/sheet': readField,
	'POST /farms/[farmId]/fields/[fieldId]/plans/[season]/sheet?/email': editField,

	// The season's record book of a field.
	'GET /farms/[farmId]/fields/[fieldId]/seasons/[season]': readField,
	'GET /farms/[farmId]/fields/[fieldId]/seasons/[season]/quick': logRecords,
	'POST /farms/[farmId]/fields/[fieldId]/seasons/[season]/quick': logRecords,
	'GET /farms/[farmId]/fields/[fieldId]/seasons/[season]/records/new': logRecords,
	'POST /farms/[farmId]/fields/[fieldId]/seasons/[season]/records/new': logRecords,
	'GET /farms/[farmId]/fields/[fieldId]/seasons/[season]/records/[recordId]': readField,
	'POST /farms/[farmId]/fields/[fieldId]/seasons/[season]/records/[recordId]?/save': logRecords,
	'POST /farms/[farmId]/fields/[fieldId]/seasons/[season]/records/[recordId]?/delete': logRecords,
	'POST /farms/[farmId]/fields/[fieldId]/seasons/[season]/records/[recordId]?/restore': editField,
	'GET /farms/[farmId]/fields/[fieldId]/seasons/[season]/scouting': readField,
	'POST /farms/[farmId]/fields/[fieldId]/seasons/[season]/scouting?/add': scout,
	'POST /farms/[farmId]/fields/[fieldId]/seasons/[season]/scouting?/delete': scout,
	'POST /farms/[farmId]/fields/[fieldId]/seasons/[season]/scouting?/restore': editField,
	'GET /farms/[farmId]/fields/[fieldId]/seasons/[season]/harvest': readField,
	'POST /farms/[farmId]/fields/[fieldId]/seasons/[season]/harvest?/log': logRecords,
	'POST /farms/[farmId]/fields/[fieldId]/seasons/[season]/harvest?/delete': logRecords,
	'GET /farms/[farmId]/fields/[fieldId]/seasons/[season]/harvest/import': readField,
	'POST /farms/[farmId]/fields/[fieldId]/seasons/[season]/harvest/import?/upload': logRecords,
	'POST /farms/[farmId]/fields/[fieldId]/seasons/[season]/harvest/import?/mapping': logRecords,

	// Equipment, products, seeds.
	'GET /farms/[farmId]/equipment': read,
	'GET /farms/[farmId]/equipment/new': editPlans,
	'POST /farms/[farmId]/equipment/new?/create': editPlans,
	'GET /farms/[farmId]/equipment/[equipmentId]': { cap: 'read', viewerHidden: true },
	'POST /farms/[farmId]/equipment/[equipmentId]?/save': editPlans,
	'POST /farms/[farmId]/equipment/[equipmentId]?/delete': editPlans,
	'GET /farms/[farmId]/products': read,
	'GET /farms/[farmId]/products/new': editPlans,
	'POST /farms/[farmId]/products/new?/create': editPlans,
	'GET /farms/[farmId]/products/[productId]': read,
	'POST /farms/[farmId]/products/[productId]?/save': editPlans,
	'POST /farms/[farmId]/products/[productId]?/delete': editPlans,
	'GET /farms/[farmId]/seeds': read,
	'POST /farms/[farmId]/seeds?/create': editPlans,
	'GET /farms/[farmId]/seeds/[varietyId]': read,
	'POST /farms/[farmId]/seeds/[varietyId]?/save': editPlans,
	'POST /farms/[farmId]/seeds/[varietyId]?/delete': editPlans,
	'POST /farms/[farmId]/seeds/[varietyId]?/addLot': editPlans,
	'POST /farms/[farmId]/seeds/[varietyId]?/deleteLot': editPlans,

	// Livestock and rainfall.
	'GET /farms/[farmId]/livestock': read,
	'POST /farms/[farmId]/livestock?/createGroup': editPlans,
	'POST /farms/[farmId]/livestock?/move': logFarm,
	'POST /farms/[farmId]/livestock?/next': logFarm,
	'GET /farms/[farmId]/livestock/[groupId]': read,
	'POST /farms/[farmId]/livestock/[groupId]?/event': logFarm,
	'GET /farms/[farmId]/rainfall': read,
	'POST /farms/[farmId]/rainfall?/addReading': logFarm,
	'POST /farms/[farmId]/rainfall?/correctReading': logFarm,
	'POST /farms/[farmId]/rainfall?/deleteReading': logFarm,
	'POST /farms/[farmId]/rainfall?/addGauge': editPlans,
	'POST /farms/[farmId]/rainfall?/deleteGauge': editPlans,

	// Share links (tours) are made and revoked by those who edit plans.
	'GET /farms/[farmId]/tours': editPlans,
	'POST /farms/[farmId]/tours?/revoke': editPlans,
	'GET /farms/[farmId]/tours/new': editPlans,
	'POST /farms/[farmId]/tours/new': editPlans,
	'GET /farms/[farmId]/tours/[tourId]': editPlans,
	'POST /farms/[farmId]/tours/[tourId]?/photos': editPlans,

	// JSON API: fields and plans.
	'GET /api/farms/[farmId]/fields': read,
	'POST /api/farms/[farmId]/fields': editPlans,
	'POST /api/farms/[farmId]/fields/import': editPlans,
	'GET /api/farms/[farmId]/fields/[fieldId]': readField,
	'PATCH /api/farms/[farmId]/fields/[fieldId]': editField,
	'DELETE /api/farms/[farmId]/fields/[fieldId]': editField,
	'GET /api/farms/[farmId]/fields/[fieldId]/export.geojson': readField,
	'GET /api/farms/[farmId]/fields/[fieldId]/export.shp.zip': readField,
	'GET /api/farms/[farmId]/fields/[fieldId]/taskdata.zip': readField,
	'GET /api/farms/[farmId]/fields/[fieldId]/plans': readField,
	'GET /api/farms/[farmId]/fields/[fieldId]/plans/[season]': readField,
	'PUT /api/farms/[farmId]/fields/[fieldId]/plans/[season]': editField,
	'POST /api/farms/[farmId]/fields/[fieldId]/plans/[season]/next': editField,
	'GET /api/farms/[farmId]/fields/[fieldId]/plans/[season]/lanes.geojson': readField,
	'GET /api/farms/[farmId]/fields/[fieldId]/plans/[season]/sheet.pdf': readField,

	// JSON API: a field's season.
	'GET /api/farms/[farmId]/fields/[fieldId]/seasons/[season]/records': readField,
	'POST /api/farms/[farmId]/fields/[fieldId]/seasons/[season]/records': logRecords,
	'GET /api/farms/[farmId]/fields/[fieldId]/seasons/[season]/records.csv': readField,
	'GET /api/farms/[farmId]/fields/[fieldId]/seasons/[season]/records/[recordId]': readField,
	'PATCH /api/farms/[farmId]/fields/[fieldId]/seasons/[season]/records/[recordId]': logRecords,
	'DELETE /api/farms/[farmId]/fields/[fieldId]/seasons/[season]/records/[recordId]': logRecords,
	'POST /api/farms/[farmId]/fields/[fieldId]/seasons/[season]/records/[recordId]/restore': editField,
	'GET /api/farms/[farmId]/fields/[fieldId]/seasons/[season]/restrictions': readField,
	'GET /api/farms/[farmId]/fields/[fieldId]/seasons/[season]/scouting': readField,
	'POST /api/farms/[farmId]/fields/[fieldId]/seasons/[season]/scouting': scout,
	'GET /api/farms/[farmId]/fields/[fieldId]/seasons/[season]/scouting/[noteId]': readField,
	'PATCH /api/farms/[farmId]/fields/[fieldId]/seasons/[season]/scouting/[noteId]': scout,
	'DELETE /api/farms/[farmId]/fields/[fieldId]/seasons/[season]/scouting/[noteId]': scout,
	'POST /api/farms/[farmId]/fields/[fieldId]/seasons/[season]/scouting/[noteId]/photos': scout,
	'POST /api/farms/[farmId]/fields/[fieldId]/seasons/[season]/scouting/[noteId]/restore': editField,
	'GET /api/farms/[farmId]/fields/[fieldId]/seasons/[season]/harvest': readField,
	'POST /api/farms/[farmId]/fields/[fieldId]/seasons/[season]/harvest': logRecords,
	'GET /api/farms/[farmId]/fields/[fieldId]/seasons/[season]/harvest.csv': readField,
	'DELETE /api/farms/[farmId]/fields/[fieldId]/seasons/[season]/harvest/[entryId]': logRecords,
	'GET /api/farms/[farmId]/fields/[fieldId]/seasons/[season]/yield-imports': readField,
	'POST /api/farms/[farmId]/fields/[fieldId]/seasons/[season]/yield-imports': logRecords,
	'GET /api/farms/[farmId]/fields/[fieldId]/seasons/[season]/yield-imports/[importId]': readField,
	'PUT /api/farms/[farmId]/fields/[fieldId]/seasons/[season]/yield-imports/[importId]/mapping': logRecords,
	'GET /api/farms/[farmId]/yield-mappings': read,
	// A scouting photo belongs to its note's field.
	'GET /api/farms/[farmId]/photos/[photoId]': readField,
	'DELETE /api/farms/[farmId]/photos/[photoId]': scout,

	// JSON API: the whole farm's season and reports.
	'GET /api/farms/[farmId]/seasons/[season]': read,
	'GET /api/farms/[farmId]/seasons/[season]/lanes.geojson': read,
	'GET /api/farms/[farmId]/seasons/[season]/lane-records': readField,
	'GET /api/farms/[farmId]/seasons/[season]/needs.csv': read,
	'GET /api/farms/[farmId]/seasons/[season]/summary': read,
	'GET /api/farms/[farmId]/reports/acreage': read,
	'GET /api/farms/[farmId]/reports/acreage.csv': read,
	'GET /api/farms/[farmId]/reports/acreage.pdf': read,
	'GET /api/farms/[farmId]/reports/landlord/[fieldId]': readField,
	'GET /api/farms/[farmId]/reports/landlord/[fieldId]/summary.pdf': readField,

	// JSON API: catalogues.
	'GET /api/farms/[farmId]/products': read,
	'POST /api/farms/[farmId]/products': editPlans,
	'GET /api/farms/[farmId]/products/[productId]': read,
	'PATCH /api/farms/[farmId]/products/[productId]': editPlans,
	'DELETE /api/farms/[farmId]/products/[productId]': editPlans,
	'GET /api/farms/[farmId]/varieties': read,
	'POST /api/farms/[farmId]/varieties': editPlans,
	'GET /api/farms/[farmId]/varieties/[varietyId]': read,
	'PATCH /api/farms/[farmId]/varieties/[varietyId]': editPlans,
	'DELETE /api/farms/[farmId]/varieties/[varietyId]': editPlans,
	'GET /api/farms/[farmId]/varieties/[varietyId]/lots': read,
	'POST /api/farms/[farmId]/varieties/[varietyId]/lots': editPlans,
	'DELETE /api/farms/[farmId]/varieties/[varietyId]/lots/[lotId]': editPlans,

	// JSON API: livestock and rainfall.
	'GET /api/farms/[farmId]/livestock/groups': read,
	'POST /api/farms/[farmId]/livestock/groups': editPlans,
	'GET /api/farms/[farmId]/livestock/groups/[groupId]': read,
	'PATCH /api/farms/[farmId]/livestock/groups/[groupId]': editPlans,
	'DELETE /api/farms/[farmId]/livestock/groups/[groupId]': editPlans,
	'GET /api/farms/[farmId]/livestock/groups/[groupId]/events': read,
	'POST /api/farms/[farmId]/livestock/groups/[groupId]/events': logFarm,
	'POST /api/farms/[farmId]/livestock/groups/[groupId]/next-move': logFarm,
	'GET /api/farms/[farmId]/livestock/moves': read,
	'POST /api/farms/[farmId]/livestock/moves': logFarm,
	// A grazing move is made on one field's lane.
	'GET /api/farms/[farmId]/livestock/moves/[moveId]': readField,
	'DELETE /api/farms/[farmId]/livestock/moves/[moveId]': logRecords,
	'GET /api/farms/[farmId]/rainfall/gauges': read,
	'POST /api/farms/[farmId]/rainfall/gauges': editPlans,
	'PATCH /api/farms/[farmId]/rainfall/gauges/[gaugeId]': editPlans,
	'DELETE /api/farms/[farmId]/rainfall/gauges/[gaugeId]': editPlans,
	'GET /api/farms/[farmId]/rainfall/readings': read,
	'POST /api/farms/[farmId]/rainfall/readings': logFarm,
	'PATCH /api/farms/[farmId]/rainfall/readings/[readingId]': logFarm,
	'DELETE /api/farms/[farmId]/rainfall/readings/[readingId]': logFarm,
	'GET /api/farms/[farmId]/rainfall/seasons/[season]': read,

	// JSON API: tours.
	'GET /api/farms/[farmId]/tours': editPlans,
	'POST /api/farms/[farmId]/tours': editPlans,
	'DELETE /api/farms/[farmId]/tours/[tourId]': editPlans,
	'POST /api/farms/[farmId]/tours/[tourId]/stops/[stop]/photos': editPlans
};
