// Body sections of the sheet, in print order after the header and map.
import type { SheetData } from '../../sheet/types';
import { drawSwatch, styleOf, type CropStyle } from './crop-style';
import { checkText } from './header';
import { drawTable, type TableCell } from './table';
import { formatAcres, formatFeet, formatPopulation, laneNumbers } from './text';
import { BODY, INK, PAGE, PAPER, SheetWriter, type TextStyle } from './writer';

type Equipment = NonNullable<SheetData['equipment']>;

export function drawLanesTable(w: SheetWriter, data: SheetData, styles: Map<string, CropStyle>): void {
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
		{ title: 'Lanes', size: 11 }
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
			{ header: 'Seed', width: Math.max(150, 450 - lines.length * 80) },
			...lines.map((name) => ({ header: name, width: 80, align: 'center' as const }))
		],
		rows,
		{ title, size: 12 }
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

export function drawPasses(w: SheetWriter, data: SheetData): void {
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
		{ title: 'Passes, in driving order', size: 13, headerSize: 11, padY: 5 }
	);
}

export function drawChecks(w: SheetWriter, data: SheetData): void {
	w.heading('Checks');
	if (data.checks.length === 0) {
		w.paragraph('No problems found.', { size: 12, bold: true });
		return;
	}
	const ordered = [...data.checks].sort((a, b) => (a.severity === b.severity ? 0 : a.severity === 'stop' ? -1 : 1));
	const tagWidth = 58;
	w.withPageStarter(
		() => w.continuedTitle('Checks'),
		() => {
			for (const check of ordered) {
				const stop = check.severity === 'stop';
				const style: TextStyle = { size: 12, bold: stop };
				const text = checkText(check);
				const height = Math.max(w.measure(text, PAGE.contentWidth - tagWidth - 8, style), 16) + 4;
				w.ensure(height);
				const tag = stop ? 'STOP' : 'CHECK';
				if (stop) w.doc.rect(PAGE.left, w.y, tagWidth - 6, 16).fill(INK);
				else w.doc.lineWidth(1.2).strokeColor(INK).rect(PAGE.left, w.y, tagWidth - 6, 16).stroke();
				const tagStyle: TextStyle = { size: 11, bold: true, align: 'center', color: stop ? PAPER : INK };
				w.writeLine(tag, PAGE.left, w.y + 2, tagStyle, tagWidth - 6);
				w.write(text, PAGE.left + tagWidth, w.y + 1, PAGE.contentWidth - tagWidth - 8, style);
				w.y += height;
			}
		}
	);
}

function drawList(w: SheetWriter, title: string, items: string[], empty: string): void {
	w.heading(title);
	if (items.length === 0) w.paragraph(empty);
	w.withPageStarter(
		() => w.continuedTitle(title),
		() => items.forEach((item) => w.paragraph(`• ${item}`, { size: 12 }, 4))
	);
}

export function drawHazards(w: SheetWriter, data: SheetData): void {
	drawList(w, 'Hazards on the way', data.hazards, 'None recorded.');
}

export function drawQuantities(w: SheetWriter, data: SheetData): void {
	if (data.quantities.length === 0) {
		drawList(w, 'Quantities', [], 'No quantities computed.');
		return;
	}
	drawTable(
		w,
		[
			{ header: 'What', width: 150 },
			{ header: 'Amount', width: 170 },
			{ header: 'How it was worked out', width: 220 }
		],
		data.quantities.map((q) => [{ text: q.label, bold: true }, { text: q.amount, bold: true }, q.detail ?? '']),
		{ title: 'Quantities', size: 11 }
	);
}

/** "Row units checked before the first pass: ____ (name) ____ (date/time)", with room to write. */
export function drawSignOff(w: SheetWriter): void {
	const label: TextStyle = { size: 13, bold: true };
	const caption: TextStyle = { size: 11 };
	w.ensure(60);
	w.gap(10);
	w.paragraph('Row units checked before the first pass:', label);
	const lineY = w.y + 24;
	const nameEnd = PAGE.left + 280;
	const dateStart = nameEnd + 70;
	const dateEnd = PAGE.right - 70;
	w.doc.lineWidth(1).strokeColor(INK);
	w.doc.moveTo(PAGE.left, lineY).lineTo(nameEnd, lineY).moveTo(dateStart, lineY).lineTo(dateEnd, lineY).stroke();
	w.writeLine('(name)', nameEnd + 6, lineY - 12, caption);
	w.writeLine('(date/time)', dateEnd + 6, lineY - 12, caption);
	w.y = lineY + 10;
}

export function drawCautions(w: SheetWriter, data: SheetData): void {
	if (data.cautions.length === 0) return;
	const style: TextStyle = { ...BODY, size: 11 };
	const texts = data.cautions.map((c) => w.clean(c));
	const height = texts.reduce((sum, t) => sum + w.measure(t, PAGE.contentWidth - 16, style) + 4, 0) + 28;
	w.ensure(Math.min(height, PAGE.bottom - PAGE.top));
	w.gap(6);
	const top = w.y;
	const page = w.page;
	w.write('Cautions', PAGE.left + 8, w.y + 6, PAGE.contentWidth - 16, { size: 12, bold: true });
	w.y += 24;
	for (const text of texts) w.paragraph(text, style, 8);
	if (w.page === page) w.doc.lineWidth(1.5).strokeColor(INK).rect(PAGE.left, top, PAGE.contentWidth, w.y - top + 4).stroke();
	w.y += 8;
}
