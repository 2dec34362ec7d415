// Body sections of the sheet, in print order after the header and map.
import type { SheetData } from '../../sheet/types';
import { compactNumbers } from '../../farm/condense';
import { checkGroupsOf, FULL_LANE_LIST_MAX, letteredPasses, laneGroupLabel, laneGroups, passSetup, passSetupKeys, usualSetup } from '../../sheet/condensed';
import { drawSwatch, styleOf, type CropStyle } from './crop-style';
import { drawTable, type TableCell } from './table';
import { formatAcres, formatFeet, formatPopulation, laneNumbers } from './text';
import { BODY, INK, PAGE, PAPER, SheetWriter, type TextStyle } from './writer';
import { BOLD, REGULAR } from './fonts';

type Equipment = NonNullable<SheetData['equipment']>;

/** Lanes in one table: each lane on a small field (or when asked), otherwise lanes set up alike share a row. */
export function drawLanesTable(w: SheetWriter, data: SheetData, styles: Map<string, CropStyle>, options: { everyLane?: boolean; title?: string } = {}): void {
	if (data.lanes.length > 0 && !options.everyLane && data.lanes.length > FULL_LANE_LIST_MAX) {
		drawLaneGroups(w, data, styles);
		return;
	}
	const title = options.title ?? 'Lanes';
	if (data.lanes.length === 0) {
		w.heading('Lanes');
		w.paragraph('This plan has no lanes.', { size: 12, bold: true });
		return;
	}
	const rows = [...data.lanes]
		.sort((a, b) => a.index - b.index)
		.map((lane): (TableCell | string)[] => {
			const style = styleOf(styles, lane.crop);
			return [
				{ text: `Lane ${lane.index + 1}`, bold: true },
				lane.kind,
				{ text: lane.crop, mark: { size: 11, draw: (x, y) => drawSwatch(w.doc, style, x, y, 11) } },
				{ text: formatFeet(lane.widthFt), bold: true },
				lane.rowSpacingIn ? `${lane.rows} × ${lane.rowSpacingIn} in` : String(lane.rows),
				formatAcres(lane.acres),
				lane.variety ?? '',
				formatPopulation(lane.populationPerAcre),
				lane.trialLabel ?? ''
			];
		});
	drawTable(
		w,
		[
			{ header: 'Lane', width: 60 },
			{ header: 'Kind', width: 50 },
			{ header: 'Crop', width: 80 },
			{ header: 'Width', width: 48, align: 'right' },
			{ header: 'Rows', width: 60 },
			{ header: 'Acres', width: 44, align: 'right' },
			{ header: 'Variety', width: 76 },
			{ header: 'Seeds/ac', width: 56, align: 'right' },
			{ header: 'Trial', width: 66 }
		],
		rows,
		{ title, size: 11 }
	);
}

/** One row per lane setup: "Lanes 1, 3, 5 … 63 (32)", crop, width, rows, acres together, seed. */
function drawLaneGroups(w: SheetWriter, data: SheetData, styles: Map<string, CropStyle>): void {
	const rows = laneGroups(data.lanes).map((g): (TableCell | string)[] => {
		const style = styleOf(styles, g.crop);
		return [
			{ text: laneGroupLabel(g), bold: true },
			{ text: g.kind === 'crop' || g.kind === g.crop ? g.crop : `${g.kind}, ${g.crop}`, mark: { size: 10, draw: (x, y) => drawSwatch(w.doc, style, x, y, 10) } },
			{ text: formatFeet(g.widthFt), bold: true },
			g.rowSpacingIn ? `${g.rows} × ${g.rowSpacingIn} in` : String(g.rows),
			formatAcres(g.acres),
			g.variety ?? '',
			formatPopulation(g.populationPerAcre),
			g.trialLabel ?? ''
		];
	});
	drawTable(
		w,
		[
			{ header: 'Lanes', width: 132 },
			{ header: 'Crop', width: 62 },
			{ header: 'Width', width: 36, align: 'right' },
			{ header: 'Rows', width: 50 },
			{ header: 'Acres', width: 38, align: 'right' },
			{ header: 'Variety', width: 98 },
			{ header: 'Seeds/ac', width: 50, align: 'right' },
			{ header: 'Trial', width: 74 }
		],
		rows,
		{ title: `Lanes, ${data.lanes.length} in all: lanes set up alike share a row`, size: 9.5, headerSize: 8.5, padY: 1.5, padX: 3 }
	);
}

function fertilizerLines(equipment: Equipment): string[] {
	const names: string[] = [];
	for (const unit of equipment.units) for (const f of unit.fertilizer) if (!names.includes(f.name)) names.push(f.name);
	return names;
}

interface UnitRun {
	first: number;
	last: number;
	seed: string | null;
	on: boolean[];
}

/** Neighbouring units set up alike share one row, so the odd unit out stands alone. */
function unitRuns(equipment: Equipment, lines: string[]): UnitRun[] {
	const runs: UnitRun[] = [];
	for (const unit of [...equipment.units].sort((a, b) => a.unit - b.unit)) {
		const on = lines.map((name) => unit.fertilizer.find((f) => f.name === name)?.on ?? false);
		const last = runs[runs.length - 1];
		if (last && last.last === unit.unit - 1 && last.seed === unit.seed && last.on.every((v, i) => v === on[i])) {
			last.last = unit.unit;
		} else {
			runs.push({ first: unit.unit, last: unit.unit, seed: unit.seed, on });
		}
	}
	return runs;
}

export function drawRowUnits(w: SheetWriter, equipment: Equipment): void {
	const lines = fertilizerLines(equipment);
	const title = `Row units: ${equipment.name}, ${formatFeet(equipment.widthFt)} wide${
		equipment.rowSpacingIn ? `, ${equipment.rowSpacingIn} in rows` : ''
	}`;
	if (equipment.units.length === 0) {
		w.heading(title);
		w.paragraph('This planter has no row units set up.', { size: 12, bold: true });
		return;
	}
	const rows = unitRuns(equipment, lines).map((run): (TableCell | string)[] => [
		{ text: run.first === run.last ? `Unit ${run.first}` : `Units ${run.first}–${run.last}`, bold: true },
		run.seed ? { text: run.seed } : { text: 'OFF (no seed)', bold: true },
		...run.on.map((on): TableCell => (on ? { text: 'ON', bold: true } : { text: 'off' }))
	]);
	drawTable(
		w,
		[
			{ header: 'Units', width: 90 },
			{ header: 'Seed', width: Math.max(150, 450 - lines.length * 110) },
			...lines.map((name) => ({ header: name, width: 110, align: 'center' as const }))
		],
		rows,
		{ title, size: 10, headerSize: 9, padY: 1.5 }
	);
}

/**
 * "Lanes 1–2: units 1–8 corn" → "units 1–8 corn" when the prefix names exactly the lanes the
 * Lanes column already shows; any other summary is printed whole.
 */
export function withoutLanePrefix(summary: string, laneIndexes: number[]): string {
	const match = /^Lanes? ([\d,\s–-]+):\s*/.exec(summary);
	if (!match || match[0].length === summary.length) return summary;
	const named = new Set<number>();
	for (const part of match[1].split(',')) {
		const [from, to = from] = part.trim().split(/[–-]/).map(Number);
		if (!Number.isInteger(from) || !Number.isInteger(to) || to < from || to - from > 10_000) return summary;
		for (let n = from; n <= to; n++) named.add(n);
	}
	const shown = new Set(laneIndexes.map((i) => i + 1));
	const same = named.size === shown.size && [...named].every((n) => shown.has(n));
	return same ? summary.slice(match[0].length) : summary;
}

/** Up to this many passes the list gives each pass a full line; more are set four to a row. */
export const FULL_PASS_LIST_MAX = 24;

export function drawPasses(w: SheetWriter, data: SheetData, options: { full?: boolean; title?: string } = {}): void {
	if (data.passes.length > FULL_PASS_LIST_MAX && letteredPasses(data.passes) && !options.full) {
		drawLetteredPassGrid(w, data);
		return;
	}
	if (data.passes.length > FULL_PASS_LIST_MAX && !options.full) {
		drawPassGrid(w, data);
		return;
	}
	if (data.passes.length === 0) {
		w.heading('Passes');
		w.paragraph('No passes: the planter does not cover any lane.', { size: 13, bold: true });
		return;
	}
	const box = 15;
	const rows = [...data.passes]
		.sort((a, b) => a.number - b.number)
		.map((pass): (TableCell | string)[] => [
			{ text: `Pass ${pass.number}`, bold: true, mark: { size: box, draw: (x, y) => w.checkbox(x, y, box) } },
			{ text: `from ${pass.startsAt}`, bold: true },
			laneNumbers(pass.laneIndexes) || 'none',
			withoutLanePrefix(pass.summary, pass.laneIndexes),
			{ text: String(pass.unitsOn), bold: true }
		]);
	drawTable(
		w,
		[
			{ header: 'Done / Pass', width: 90 },
			{ header: 'Start', width: 58 },
			{ header: 'Lanes', width: 64 },
			{ header: 'What the planter does', width: 272 },
			{ header: 'Units on', width: 56, align: 'right' }
		],
		rows,
		{ title: options.title ?? 'Passes, in driving order', size: 13, headerSize: 11, padY: 5 }
	);
}

/**
 * Many passes, four to a row (read across), each with its tick box, start end, lanes and units
 * on. The setup most passes share is written once above; a pass set up otherwise says how.
 */
function drawPassGrid(w: SheetWriter, data: SheetData): void {
	const passes = [...data.passes].sort((a, b) => a.number - b.number);
	const usual = usualSetup(passes);
	const box = 12;
	// Passes set up otherwise are marked * and said below the grid, alike ones together.
	const otherwise = new Map<string, number[]>();
	const lanesText = passes.map((pass) => {
		const setup = passSetup(pass.summary);
		if (setup !== usual) otherwise.set(setup, [...(otherwise.get(setup) ?? []), pass.number]);
		return `${laneNumbers(pass.laneIndexes) || 'none'}${setup === usual ? '' : ' *'}`;
	});
	// Column widths from what they hold (10-pt figures are about 5.8 pt wide), as many passes to a row as fit.
	const lanesWidth = Math.max(36, Math.max(...lanesText.map((t) => t.length)) * 5.8 + 8);
	const group = [
		{ header: 'Pass', width: 38 },
		{ header: 'From', width: 27 },
		{ header: 'Lanes', width: lanesWidth },
		{ header: 'On', width: 18, align: 'right' as const }
	];
	const groupWidth = group.reduce((sum, c) => sum + c.width, 0);
	const perRow = Math.max(1, Math.min(4, Math.floor(PAGE.contentWidth / groupWidth)));
	const cells = passes.map((pass, i): (TableCell | string)[] => [
		{ text: String(pass.number), bold: true, mark: { size: box, draw: (x, y) => w.checkbox(x, y, box) } },
		{ text: pass.startsAt, bold: true },
		{ text: lanesText[i], bold: lanesText[i].endsWith('*') },
		{ text: String(pass.unitsOn), bold: true }
	]);
	const rows: (TableCell | string)[][] = [];
	for (let i = 0; i < cells.length; i += perRow) {
		const row = cells.slice(i, i + perRow);
		while (row.length < perRow) row.push(['', '', '', '']);
		rows.push(row.flat());
	}
	w.heading('Passes, in driving order: read across, tick each when done', 70);
	if (usual) w.paragraph(`Every pass unless marked *: ${usual}. "From" is the end the pass starts at; "On" is the row units planting.`, { size: 10, bold: true });
	drawTable(w, Array.from({ length: perRow }, () => group).flat(), rows, { title: 'Passes, in driving order', size: 10, headerSize: 9, padY: 2, padX: 2, noHeading: true, breakable: true });
	for (const [setup, numbers] of otherwise) {
		w.paragraph(`* ${numbers.length === 1 ? `Pass ${numbers[0]}` : `Passes ${compactNumbers(numbers)}`}: ${setup}.`, { size: 10, bold: true });
	}
}

/**
 * Very many passes (a planter that does not suit the lanes makes several a lane): six to a row,
 * each with its tick box, start end, lanes and a setup letter; the key above says each setup once
 * with its row units on.
 */
function drawLetteredPassGrid(w: SheetWriter, data: SheetData): void {
	const passes = [...data.passes].sort((a, b) => a.number - b.number);
	const { keys, letterOf } = passSetupKeys(passes);
	const box = 9;
	const size = 9;
	const lanesText = passes.map((pass) => laneNumbers(pass.laneIndexes) || 'none');
	// Columns as wide as what they hold (measured), as many passes to a row as fit.
	const widest = (texts: string[], bold: boolean) => Math.max(...texts.map((t) => w.textWidth(t, { size, bold })));
	const padX = 1.5;
	const pad = 2 * padX + 1;
	const group = [
		{ header: 'Pass', width: box + 4 + widest(passes.map((p) => String(p.number)), true) + pad },
		{ header: '', width: widest(['A', 'B'], true) + pad },
		{ header: 'Lanes', width: Math.max(w.textWidth('Lanes', { size: 8.5, bold: true }), widest(lanesText, false)) + pad },
		{ header: '', width: widest([...letterOf.values()], true) + pad }
	];
	const groupWidth = group.reduce((sum, c) => sum + c.width, 0);
	const perRow = Math.max(1, Math.min(7, Math.floor(PAGE.contentWidth / groupWidth)));
	const cells = passes.map((pass, i): (TableCell | string)[] => [
		{ text: String(pass.number), bold: true, mark: { size: box, draw: (x, y) => w.checkbox(x, y, box) } },
		{ text: pass.startsAt, bold: true },
		lanesText[i],
		{ text: letterOf.get(pass.number) ?? '', bold: true }
	]);
	const rows: (TableCell | string)[][] = [];
	for (let i = 0; i < cells.length; i += perRow) {
		const row = cells.slice(i, i + perRow);
		while (row.length < perRow) row.push(['', '', '', '']);
		rows.push(row.flat());
	}
	w.heading(`Passes, ${passes.length} in driving order: read across, tick each when done`, 60);
	w.paragraph('Each pass: tick box, number, start end (A or B), lanes, setup letter. Setups (units not named are off):', { size: 9 });
	drawTwoColumns(
		w,
		keys.map((key) => `${key.letter} · ${key.unitsOn} on: ${key.planting}`),
		{ size: 9, bold: true }
	);
	drawTable(w, Array.from({ length: perRow }, () => group).flat(), rows, { title: 'Passes, in driving order', size, headerSize: 8, padY: 1, padX, noHeading: true, breakable: true, lineGap: 0 });
}

/** Short items in two columns, read down the left column and then the right. */
function drawTwoColumns(w: SheetWriter, items: string[], style: TextStyle): void {
	const gap = 12;
	const width = (PAGE.contentWidth - gap) / 2;
	const half = Math.ceil(items.length / 2);
	for (let r = 0; r < half; r++) {
		const pair = [items[r], items[r + half]].filter((t): t is string => t !== undefined);
		const height = Math.max(...pair.map((t) => w.measure(t, width, style))) + 2;
		w.ensure(height);
		pair.forEach((t, c) => w.write(t, PAGE.left + c * (width + gap), w.y, width, style));
		w.y += height;
	}
	w.y += 2;
}

/** One line per kind of problem with what it costs, STOP first; the appendix has every finding. */
export function drawChecks(w: SheetWriter, data: SheetData, options: { appendix?: boolean } = {}): void {
	const groups = checkGroupsOf(data);
	const long = groups.some((g) => g.details.length > 1);
	w.heading(long && !options.appendix ? 'Checks (each lane and pass of these is in the appendix: tick "Print the full lists")' : 'Checks');
	if (groups.length === 0) {
		w.paragraph('No problems found.', { size: 12, bold: true });
		return;
	}
	const tagWidth = 52;
	w.withPageStarter(
		() => w.continuedTitle('Checks'),
		() => {
			for (const group of groups) {
				const stop = group.severity === 'stop';
				const style: TextStyle = { size: stop ? 11 : 9, bold: stop };
				// STOP items stand in full in the box at the top of page 1; here they are named once more.
				const text = stop && !options.appendix ? `${firstWords(group.summary)} (see the STOP box on page 1)` : group.summary;
				const height = Math.max(w.measure(text, PAGE.contentWidth - tagWidth - 8, style), 14) + 3;
				w.ensure(height);
				const tag = stop ? 'STOP' : 'CHECK';
				if (stop) w.doc.rect(PAGE.left, w.y, tagWidth - 6, 13).fill(INK);
				else w.doc.lineWidth(1.2).strokeColor(INK).rect(PAGE.left, w.y, tagWidth - 6, 13).stroke();
				const tagStyle: TextStyle = { size: 9, bold: true, align: 'center', color: stop ? PAPER : INK };
				w.writeLine(tag, PAGE.left, w.y + 2, tagStyle, tagWidth - 6);
				w.write(text, PAGE.left + tagWidth, w.y + 1, PAGE.contentWidth - tagWidth - 8, style);
				w.y += height;
			}
		}
	);
}

/** The start of a long line, cut at a word: "31 passes (1, 2, 3 … 31): Nitrogen (UAN 32 %) is on at row unit 9 …". */
function firstWords(text: string, max = 56): string {
	if (text.length <= max) return text.replace(/\.$/, '');
	const cut = text.slice(0, max);
	return `${cut.slice(0, cut.lastIndexOf(' '))} …`;
}

/**
 * The full lists, printed only when asked: every finding of each check, every lane and every
 * pass in full.
 */
export function drawAppendix(w: SheetWriter, data: SheetData, styles: Map<string, CropStyle>): void {
	w.newPage();
	w.paragraph('Appendix: the full lists', { size: 18, bold: true });
	const listed = checkGroupsOf(data).filter((g) => g.details.length > 1);
	if (listed.length) {
		w.heading('Every finding of each check');
		w.withPageStarter(
			() => w.continuedTitle('Every finding of each check'),
			() => {
				for (const g of listed) {
					w.paragraph(`${g.severity === 'stop' ? 'STOP' : 'CHECK'}: ${g.summary}`, { size: 11, bold: true });
					for (const d of g.details) w.paragraph(`• ${d}`, { size: 9 }, 10);
					w.gap(4);
				}
			}
		);
	}
	if (data.lanes.length > FULL_LANE_LIST_MAX) drawLanesTable(w, data, styles, { everyLane: true });
	if (data.equipment && data.passes.length > FULL_PASS_LIST_MAX) drawPasses(w, data, { full: true });
}

function drawList(w: SheetWriter, title: string, items: string[], empty: string): void {
	w.heading(title);
	if (items.length === 0) w.paragraph(empty);
	w.withPageStarter(
		() => w.continuedTitle(title),
		() => items.forEach((item) => w.paragraph(`• ${item}`, { size: 9 }, 4))
	);
}

export function drawHazards(w: SheetWriter, data: SheetData): void {
	drawList(w, 'Hazards on the way', data.hazards, 'None recorded.');
}

/**
 * Hazards on the left, quantities on the right, side by side so the sheet stays on one sheet of
 * paper; one after the other when the pair would not fit on a page.
 */
export function drawHazardsAndQuantities(w: SheetWriter, data: SheetData): void {
	const gap = 14;
	const leftWidth = 200;
	const rightWidth = PAGE.contentWidth - leftWidth - gap;
	const hazardStyle: TextStyle = { size: 9 };
	const amountStyle: TextStyle = { size: 9, bold: true };
	const detailStyle: TextStyle = { size: 8 };
	const hazards = data.hazards.length ? data.hazards.map((h) => `• ${h}`) : ['None recorded.'];
	const quantities = data.quantities.map((q) => ({ head: `${q.label} ${q.amount}`, detail: q.detail ?? '' }));
	const titleStyle: TextStyle = { size: 12, bold: true };
	const titleHeight = 16;
	const left = hazards.reduce((sum, h) => sum + w.measure(h, leftWidth - 4, hazardStyle) + 2, titleHeight);
	// An upper bound: the detail measured in the amount's larger bold type.
	const right = quantities.reduce((sum, q) => sum + w.measure(`${q.head} ${q.detail}`, rightWidth, amountStyle) + 3, titleHeight + w.measure('x', rightWidth, detailStyle) + 2);
	const height = Math.max(left, right) + 6;
	if (quantities.length === 0 || height > (PAGE.bottom - PAGE.top) / 2) {
		drawHazards(w, data);
		drawQuantities(w, data);
		return;
	}
	w.ensure(height + 4);
	w.gap(4);
	const top = w.y;
	const rightX = PAGE.left + leftWidth + gap;
	w.write('Hazards on the way', PAGE.left, top, leftWidth, titleStyle);
	w.write('Quantities', rightX, top, rightWidth, titleStyle);
	w.doc.lineWidth(1.5).strokeColor(INK).moveTo(PAGE.left, top + titleHeight - 2).lineTo(PAGE.left + leftWidth, top + titleHeight - 2).moveTo(rightX, top + titleHeight - 2).lineTo(PAGE.right, top + titleHeight - 2).stroke();
	let y = top + titleHeight;
	for (const h of hazards) y += w.write(h, PAGE.left + 4, y, leftWidth - 4, hazardStyle) + 2;
	y = top + titleHeight;
	y += w.write('Arithmetic from the rates entered, not recommendations.', rightX, y, rightWidth, detailStyle) + 2;
	// Each amount in bold with how it was worked out after it, in one paragraph.
	for (const q of quantities) {
		w.doc.font(BOLD).fontSize(amountStyle.size).fillColor(INK).text(`${w.clean(q.head)}${q.detail ? ' ' : ''}`, rightX, y, { width: rightWidth, lineGap: 1, continued: Boolean(q.detail) });
		if (q.detail) w.doc.font(REGULAR).fontSize(detailStyle.size).text(w.clean(q.detail), { lineGap: 1 });
		y = w.doc.y + 3;
	}
	w.y = Math.max(top + titleHeight + left, y) + 4;
}

export function drawQuantities(w: SheetWriter, data: SheetData): void {
	if (data.quantities.length === 0) {
		drawList(w, 'Quantities', [], 'No quantities computed.');
		return;
	}
	drawTable(
		w,
		[
			{ header: 'What', width: 128 },
			{ header: 'Amount', width: 132 },
			{ header: 'How it was worked out', width: 280 }
		],
		data.quantities.map((q) => [{ text: q.label, bold: true, size: 9 }, { text: q.amount, bold: true, size: 9 }, { text: q.detail ?? '', size: 8 }]),
		{ title: 'Quantities (arithmetic from the rates entered, not recommendations)', size: 9, headerSize: 8.5, padY: 1.5 }
	);
}

/** "Row units checked before the first pass: ____ (name) ____ (date/time)", with room to write. */
export function drawSignOff(w: SheetWriter): void {
	const label: TextStyle = { size: 11, bold: true };
	const caption: TextStyle = { size: 9 };
	const text = 'Row units checked before the first pass:';
	w.ensure(28);
	w.gap(4);
	const lineY = w.y + 18;
	const nameStart = PAGE.left + w.textWidth(text, label) + 8;
	const nameEnd = nameStart + 150;
	const dateStart = nameEnd + 44;
	const dateEnd = PAGE.right - 56;
	w.writeLine(text, PAGE.left, lineY - 12, label);
	w.doc.lineWidth(1).strokeColor(INK);
	w.doc.moveTo(nameStart, lineY).lineTo(nameEnd, lineY).moveTo(dateStart, lineY).lineTo(dateEnd, lineY).stroke();
	w.writeLine('(name)', nameEnd + 4, lineY - 10, caption);
	w.writeLine('(date/time)', dateEnd + 4, lineY - 10, caption);
	w.y = lineY + 4;
}

export function drawCautions(w: SheetWriter, data: SheetData): void {
	if (data.cautions.length === 0) return;
	const style: TextStyle = { ...BODY, size: 8.5 };
	const texts = data.cautions.map((c) => w.clean(c));
	const height = texts.reduce((sum, t) => sum + w.measure(t, PAGE.contentWidth - 78, style) + 3, 0) + 20;
	w.ensure(Math.min(height, PAGE.bottom - PAGE.top));
	w.gap(4);
	const top = w.y;
	const page = w.page;
	// "Cautions" stands to the left of the cautions, so the box needs no title line of its own.
	const label: TextStyle = { size: 11, bold: true };
	const indent = 8 + w.textWidth('Cautions', label) + 8;
	w.y += 4;
	w.writeLine('Cautions', PAGE.left + 8, w.y - 1, label);
	for (const text of texts) {
		const height = w.measure(text, PAGE.contentWidth - indent - 8, style);
		w.write(text, PAGE.left + indent, w.y, PAGE.contentWidth - indent - 8, style);
		w.y += height + 3;
	}
	if (w.page === page) w.doc.lineWidth(1.5).strokeColor(INK).rect(PAGE.left, top, PAGE.contentWidth, w.y - top + 4).stroke();
	w.y += 8;
}
