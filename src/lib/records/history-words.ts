// What an edit of a record changed, field by field, in the words and units of the record page. Pure;
// the result is bound as text, never HTML.
import { RECORD_TYPE_LABELS, type RecordType } from '../schemas/records';
import { amount, farmTime, laneListText } from './format';

type Json = Record<string, unknown>;

/** Book-keeping and copies of other fields (lanes and location follow the lane list). */
const SKIP = new Set(['id', 'version', 'updatedAt', 'createdAt', 'createdBy', 'rupLate', 'rupCompletedAt', 'restrictedUse', 'deletedAt', 'lanes', 'location', 'planId', 'planVersion', 'season', 'fieldId']);

const DETAILS: Record<string, [string, string]> = {
	variety: ['variety', ''], populationPerAcre: ['population', ' seeds/ac'], depthIn: ['depth', ' in'], seedLot: ['seed lot', ''], analysis: ['analysis', ''],
	placement: ['placement', ''], method: ['seeding method', ''], heightIn: ['cutting height', ' in'], reason: ['why', '']
};

const blank = (v: unknown) => v == null || v === '' || (Array.isArray(v) && v.length === 0);
const quoted = (v: unknown) => (blank(v) ? '(blank)' : `"${String(v)}"`);

function weather(w: unknown): string {
	const x = (w ?? {}) as Json;
	const parts: string[] = [];
	if (x.tempF != null) parts.push(`${x.tempF} °F`);
	if (x.windMph != null) parts.push(`wind ${x.windMph} mph${x.windFrom ? ` from ${x.windFrom}` : ''}`);
	else if (x.windFrom) parts.push(`wind from ${x.windFrom}`);
	return parts.length ? parts.join(', ') : '(blank)';
}

function products(p: unknown): string {
	if (!Array.isArray(p) || !p.length) return '(none)';
	return p.map((l: Json) => `${l.productName ?? 'product'} ${typeof l.rate === 'number' ? amount(l.rate, 4) : l.rate} ${l.rateUnit ?? ''}`.trim()).join('; ');
}

function details(d: unknown): string {
	const x = (d ?? {}) as Json;
	const parts: string[] = [];
	for (const [k, v] of Object.entries(x)) {
		if (blank(v) || k === 'varietyId') continue;
		if (k === 'species' && Array.isArray(v)) parts.push(`mix ${v.map((s: Json) => `${s.species} ${s.rateLbPerAcre} lb/ac`).join(', ')}`);
		else {
			const [label, unit] = DETAILS[k] ?? [k, ''];
			parts.push(`${label} ${typeof v === 'number' ? amount(v, 2) : String(v)}${unit}`);
		}
	}
	return parts.length ? parts.join(', ') : '(blank)';
}

const FIELDS: Record<string, [string, (v: unknown, timeZone: string) => string]> = {
	type: ['Type of work', (v) => RECORD_TYPE_LABELS[v as RecordType] ?? String(v)],
	startedAt: ['Started', (v, tz) => (typeof v === 'string' ? farmTime(v, tz) : '(blank)')],
	endedAt: ['Ended', (v, tz) => (typeof v === 'string' ? farmTime(v, tz) : '(blank)')],
	laneIndexes: ['Lanes', (v) => (Array.isArray(v) && v.length ? laneListText(v as number[]) : '(none)')],
	acres: ['Area', (v) => (typeof v === 'number' ? `${amount(v)} ac` : '(blank)')],
	products: ['Products', products],
	applicator: ['Applicator', quoted],
	applicatorCertNumber: ['Applicator certification number', quoted],
	equipment: ['Equipment', quoted],
	weather: ['Weather', weather],
	details: ['Details', details],
	notes: ['Notes', quoted]
};

/** One line per changed field: "Notes: (blank) → "Boom height checked"". */
export function recordChanges(before: unknown, after: unknown, timeZone: string): string[] {
	if (!before || !after || typeof before !== 'object' || typeof after !== 'object') return [];
	const b = before as Json;
	const a = after as Json;
	const out: string[] = [];
	for (const key of Object.keys(a)) {
		if (SKIP.has(key)) continue;
		if (JSON.stringify(b[key] ?? null) === JSON.stringify(a[key] ?? null)) continue;
		const [label, show] = FIELDS[key] ?? [key, (v: unknown) => (blank(v) ? '(blank)' : JSON.stringify(v))];
		const was = show(b[key], timeZone);
		const now = show(a[key], timeZone);
		out.push(`${label}: ${short(was)} → ${short(now)}`);
	}
	return out;
}

const short = (s: string) => (s.length > 160 ? `${s.slice(0, 157)}…` : s);
