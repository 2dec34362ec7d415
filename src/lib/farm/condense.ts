// Long lists said once, compactly: "31 corn lanes (2, 4, 6 … 62) border last season's corn". One
// piece of code for the plan page, the compare page, the planning board and the cab sheet. Pure.

/**
 * Lane numbers (1-based) as a short list: up to `max` numbers in full, otherwise the first three,
 * an ellipsis and the last. Sorted, duplicates dropped.
 * @example compactNumbers([2, 4, 6, 8, 10, 12, 62]) // "2, 4, 6 … 62"
 */
export function compactNumbers(numbers: readonly number[], max = 6): string {
	const sorted = [...new Set(numbers)].sort((a, b) => a - b);
	if (sorted.length <= max) return sorted.join(', ');
	return `${sorted.slice(0, 3).join(', ')} … ${sorted[sorted.length - 1]}`;
}

/** "1 lane" / "31 lanes". */
export function lanesWord(n: number): string {
	return `${n} lane${n === 1 ? '' : 's'}`;
}

/** "1 pass" / "31 passes". */
export function passesWord(n: number): string {
	return `${n} pass${n === 1 ? '' : 'es'}`;
}

/** "lane 4" for one, "31 lanes (2, 4, 6 … 62)" for several; `what` goes before "lanes" ("soybean lanes"). */
export function laneListWords(numbers: readonly number[], what = ''): string {
	const sorted = [...new Set(numbers)].sort((a, b) => a - b);
	const word = what ? `${what} ` : '';
	return sorted.length === 1 ? `${word}lane ${sorted[0]}` : `${sorted.length} ${word}lanes (${compactNumbers(sorted)})`;
}

/** A warning about one lane (or none), of a kind, as the rotation and equipment checks give them. */
export interface LaneWarning {
	kind: string;
	laneIndex: number | null;
	message: string;
	/** 'stop' keeps the planter from rolling; everything else asks for a look. Default 'warn'. */
	severity?: 'stop' | 'warn';
}

export interface CondensedWarning {
	kind: string;
	severity: 'stop' | 'warn';
	/** One line for the kind, lanes listed compactly. */
	summary: string;
	/** Every message of the kind, for an expandable full list (or the sheet's appendix). */
	details: string[];
	laneNumbers: number[];
}

/**
 * One line per kind of warning instead of one box per lane. Warnings without a lane keep their
 * own message; lane warnings of a kind become `describe(count, "2, 4, 6 … 62")`.
 * @example condenseWarnings(ws, ROTATION_WORDS)
 */
export function condenseWarnings(warnings: readonly LaneWarning[], describe: Record<string, (count: number, lanes: string) => string> = {}): CondensedWarning[] {
	const out: CondensedWarning[] = [];
	const byKind = new Map<string, LaneWarning[]>();
	for (const w of warnings) {
		const severity = w.severity ?? 'warn';
		if (w.laneIndex === null) {
			out.push({ kind: w.kind, severity, summary: w.message, details: [w.message], laneNumbers: [] });
			continue;
		}
		const key = `${severity}|${w.kind}`;
		const list = byKind.get(key) ?? [];
		list.push(w);
		byKind.set(key, list);
	}
	for (const list of byKind.values()) {
		const { kind } = list[0];
		const numbers = [...new Set(list.map((w) => (w.laneIndex as number) + 1))].sort((a, b) => a - b);
		const lanes = compactNumbers(numbers);
		const summary = list.length === 1 ? list[0].message : (describe[kind]?.(numbers.length, lanes) ?? `${lanesWord(numbers.length)} (${lanes}): ${list[0].message}`);
		out.push({ kind, severity: list[0].severity ?? 'warn', summary, details: list.map((w) => w.message), laneNumbers: numbers });
	}
	return sortStopsFirst(out);
}

/** How the season-to-season checks (rotation-flags.ts) read when several lanes share one. */
export const ROTATION_WORDS: Record<string, (count: number, lanes: string) => string> = {
	corn_borders_corn: (n, lanes) => `${n} corn lanes (${lanes}) border last season's corn: scout their edge rows for rootworm.`
};

const PASS_PREFIX = /^Pass (\d+) \(from [AB]\): /;
/** "lane 12 (soybean)" or "Lane 12 (corn)" or "lane 12" inside a message. */
const LANE_WORD = /\b[Ll]ane (\d+)( \(([^)]*)\))?/g;

/**
 * Findings whose messages differ only in the pass and lane they name, said once: "31 passes
 * (1, 2, 3 … 31): Nitrogen is on at row unit 9 over 31 soybean lanes (2, 4, 6 … 62) …". A
 * message naming no pass and no lane, or one of a kind, stays word for word. STOP items first.
 * A kind with `words` that still takes more than `maxLines` lines (messages that differ in more
 * than a pass and a lane) becomes one line: "14 lanes (3, 9, 15 … 85): lane not a whole number of
 * planter widths", every message kept in the details.
 * @example condenseFindings(checks, { words: { partial_pass: 'lane not a whole number of planter widths' } })
 */
export function condenseFindings(findings: readonly LaneWarning[], options: { words?: Record<string, string>; maxLines?: number } = {}): CondensedWarning[] {
	interface Group { first: LaneWarning; template: string; crop: string | null; passes: number[]; lanes: number[]; details: string[] }
	const groups = new Map<string, Group>();
	findings.forEach((f, i) => {
		const pass = PASS_PREFIX.exec(f.message);
		const body = pass ? f.message.slice(pass[0].length) : f.message;
		const lanes: number[] = [];
		let crop: string | null = null;
		let named = 0;
		const template = body.replace(LANE_WORD, (_m, n: string, _p, what: string | undefined) => {
			named += 1;
			lanes.push(Number(n));
			crop = what ?? null;
			return '\u0000';
		});
		// Only a message naming one lane (and maybe a pass) can share a line with others.
		const key = named === 1 || (named === 0 && pass) ? `${f.severity ?? 'warn'}|${f.kind}|${template}|${crop ?? ''}` : `single|${i}`;
		const g = groups.get(key) ?? { first: f, template, crop, passes: [], lanes: [], details: [] };
		if (pass) g.passes.push(Number(pass[1]));
		g.lanes.push(...lanes);
		g.details.push(f.message);
		groups.set(key, g);
	});
	const out = [...groups.values()].map((g): CondensedWarning => {
		const lanes = [...new Set(g.lanes)].sort((a, b) => a - b);
		const base = { kind: g.first.kind, severity: g.first.severity ?? 'warn', details: g.details, laneNumbers: lanes };
		if (g.details.length === 1) return { ...base, summary: g.first.message };
		const passes = [...new Set(g.passes)].sort((a, b) => a - b);
		const lead = passes.length > 1 ? `${passesWord(passes.length)} (${compactNumbers(passes)}): ` : passes.length === 1 ? `Pass ${passes[0]}: ` : '';
		const laneText = lanes.length ? laneListWords(lanes, g.crop ?? '') : '';
		// "8 lanes (2, 6, 10 … 30) is laid out" → "are laid out".
		const body = g.template.replace(/\u0000( is | has )?/, (_m, verb?: string) => `${laneText}${verb ? (lanes.length > 1 ? (verb === ' is ' ? ' are ' : ' have ') : verb) : ''}`);
		return { ...base, summary: lead ? `${lead}${body}` : body.charAt(0).toUpperCase() + body.slice(1) };
	});
	return sortStopsFirst(mergeKinds(out, findings, options.words ?? {}, options.maxLines ?? 2));
}

/** Warn-level kinds still said in more than `maxLines` lines become one line each (STOP lines stay). */
function mergeKinds(lines: CondensedWarning[], findings: readonly LaneWarning[], words: Record<string, string>, maxLines: number): CondensedWarning[] {
	const byKind = new Map<string, CondensedWarning[]>();
	for (const l of lines) if (l.severity === 'warn' && words[l.kind]) byKind.set(l.kind, [...(byKind.get(l.kind) ?? []), l]);
	const merged = new Set<string>([...byKind].filter(([, list]) => list.length > maxLines).map(([kind]) => kind));
	if (merged.size === 0) return lines;
	const out: CondensedWarning[] = [];
	const done = new Set<string>();
	for (const l of lines) {
		if (l.severity !== 'warn' || !merged.has(l.kind)) {
			out.push(l);
			continue;
		}
		if (done.has(l.kind)) continue;
		done.add(l.kind);
		const list = byKind.get(l.kind) ?? [];
		const lanes = [...new Set(list.flatMap((x) => x.laneNumbers))].sort((a, b) => a - b);
		const passes = [...new Set(findings.filter((f) => f.kind === l.kind && (f.severity ?? 'warn') === 'warn').map((f) => PASS_PREFIX.exec(f.message)?.[1]).filter((n): n is string => !!n).map(Number))].sort((a, b) => a - b);
		const where = passes.length ? `${passesWord(passes.length)} (${compactNumbers(passes)})${lanes.length ? `, ${laneListWords(lanes)}` : ''}` : lanes.length ? laneListWords(lanes) : '';
		const what = words[l.kind];
		const summary = where ? `${where.charAt(0).toUpperCase()}${where.slice(1)}: ${what}.` : `${what.charAt(0).toUpperCase()}${what.slice(1)}.`;
		out.push({ kind: l.kind, severity: 'warn', summary, details: list.flatMap((x) => x.details), laneNumbers: lanes });
	}
	return out;
}

function sortStopsFirst(list: CondensedWarning[]): CondensedWarning[] {
	return list.map((w, i) => ({ w, i })).sort((a, b) => (a.w.severity === b.w.severity ? a.i - b.i : a.w.severity === 'stop' ? -1 : 1)).map(({ w }) => w);
}
