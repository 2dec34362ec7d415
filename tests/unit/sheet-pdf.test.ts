import { beforeAll, describe, expect, it } from 'vitest';
import { PDFParse } from 'pdf-parse';
import { NO_PLANTER, renderSheetPdf } from '../../src/lib/server/sheet-pdf';
import { laneNumbers, sanitizeText } from '../../src/lib/server/sheet-pdf/text';
import { withoutLanePrefix } from '../../src/lib/server/sheet-pdf/sections';
import { cropStyles } from '../../src/lib/server/sheet-pdf/crop-style';
import type { SheetData } from '../../src/lib/sheet/types';
import { buildSheet } from '../fixtures/sheet/sheet-data';

interface ParsedPdf {
	pages: string[];
	/** All pages joined, runs of white space as one space (wrapped lines join up again). */
	flat: string;
	info: Record<string, unknown>;
}

async function parsePdf(pdf: Buffer): Promise<ParsedPdf> {
	const parser = new PDFParse({ data: new Uint8Array(pdf) });
	try {
		const text = await parser.getText();
		const info = await parser.getInfo();
		const pages = text.pages.map((p) => p.text);
		return { pages, flat: pages.join(' ').replace(/\s+/g, ' '), info: info.info ?? {} };
	} finally {
		await parser.destroy();
	}
}

const escape = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

/** The phrase stands whole in the text: not as the start of a longer number or word ("16" is not "160"). */
const wholePhrase = (phrase: string) => new RegExp(`(^|\\s)${escape(phrase)}(?=\\s|$)`);

function expectEveryLaneLine(parsed: ParsedPdf, sheet: SheetData): void {
	const text = parsed.pages.join('\n');
	for (const lane of sheet.lanes) {
		const line = new RegExp(`^Lane ${lane.index + 1} ${lane.kind} ${escape(lane.crop)} 20 ft `, 'm');
		expect(text, `line for lane ${lane.index + 1}`).toMatch(line);
	}
	expect(text).not.toMatch(new RegExp(`^Lane ${sheet.lanes.length + 1} `, 'm'));
}

function expectPageNumbers(parsed: ParsedPdf, footer: string): void {
	const total = parsed.pages.length;
	parsed.pages.forEach((page, i) => {
		expect(page, `page ${i + 1}`).toContain(`Page ${i + 1} of ${total}`);
		expect(page, `page ${i + 1}`).toContain(footer);
	});
}

describe('renderSheetPdf: small sheet with a planter', () => {
	const sheet = buildSheet({ lanes: 5, wetSpotLanes: [2, 3] });
	let pdf: Buffer;
	let parsed: ParsedPdf;

	beforeAll(async () => {
		pdf = await renderSheetPdf(sheet, { timeZone: 'America/Chicago' });
		parsed = await parsePdf(pdf);
	});

	it('is a one- or two-page PDF with page numbers and the field in every footer', () => {
		expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
		expect(parsed.pages.length).toBeGreaterThanOrEqual(1);
		expect(parsed.pages.length).toBeLessThanOrEqual(2);
		expectPageNumbers(parsed, 'North Strips · 2027 · Adopted plan');
	});

	it('sets title, author and creation date from the sheet', () => {
		expect(parsed.info.Title).toBe('Seeding sheet — North Strips 2027');
		expect(parsed.info.Author).toBe('Stripwright');
		expect(String(parsed.info.CreationDate)).toMatch(/^D:20270420113000/);
	});

	it('prints the header facts on the first page', () => {
		const first = parsed.pages[0];
		expect(first).toContain('Seeding sheet — North Strips 2027');
		expect(first).toMatch(/Farm: Larkspur Hollow Farm/);
		expect(first).toMatch(/Plan: Adopted plan/);
		expect(first).toMatch(/Season: 2027/);
		expect(first).toMatch(/Prepared by: Robin Example/);
		expect(first).toContain(`Planted acres: ${sheet.plantedAcres.toFixed(2)}`);
		expect(first).toContain(`Field acres: ${sheet.fieldAcres.toFixed(2)}`);
		// printed 11:30 UTC, shown in the farm's zone
		expect(first).toContain('Apr 20, 2027, 6:30 AM CDT');
	});

	it('lists every lane with its crop, width, population and variety', () => {
		expectEveryLaneLine(parsed, sheet);
		const text = parsed.pages.join('\n');
		expect(text).toMatch(/^Lane 1 crop corn 20 ft 8 × 30 in [\d.]+ hybrid A 34,000$/m);
		expect(text).toMatch(/^Lane 2 crop soybean 20 ft 8 × 30 in [\d.]+ variety S1 140,000$/m);
		expect(text).toMatch(/^Lane 5 crop corn 20 ft 8 × 30 in [\d.]+ hybrid A 34,000 check strip$/m);
	});

	it('puts the STOP count at the top of the first page and again in the checks', () => {
		const first = parsed.pages[0];
		expect(first).toContain('STOP: 2 problems to fix before planting');
		expect(first.indexOf('STOP: 2 problems')).toBeLessThan(first.indexOf('Lane map'));
		// In full in the STOP box; named again, with a pointer to the box, in the checks.
		expect(parsed.flat).toContain('• Unit 12 has starter on over soybean');
		expect(parsed.flat).toContain('STOP Unit 12 has starter on over soybean (see the STOP box on page 1)');
		expect(parsed.flat).toContain('CHECK The last pass plants one lane only');
		expect(parsed.flat.indexOf('STOP The planter is wider')).toBeLessThan(parsed.flat.indexOf('CHECK The last pass'));
	});

	it('prints the row units, grouped where they are set up alike, with each line on or off', () => {
		const text = parsed.pages.join('\n');
		expect(text).toContain('Row units: 16-row strip planter, 40 ft wide, 30 in rows');
		expect(text).toMatch(/^Units Seed Starter UAN 32 %$/m);
		expect(text).toMatch(/^Units 1–8 corn — hybrid A ON ON$/m);
		expect(text).toMatch(/^Units 9–11 soybean — variety S1 off off$/m);
		expect(text).toMatch(/^Unit 12 soybean — variety S1 ON off$/m);
		expect(text).toMatch(/^Units 13–16 soybean — variety S1 off off$/m);
	});

	it('prints one line per pass with its start end, lanes and units on, in driving order', () => {
		const text = parsed.pages.join('\n');
		expect(text).toMatch(/^Pass 1 from A 1–2 units 1–8 corn \(hybrid A\), 9–16 soybean\b/m);
		expect(parsed.flat).toMatch(wholePhrase('Pass 1 from A 1–2 units 1–8 corn (hybrid A), 9–16 soybean (variety S1) 16'));
		expect(text).toMatch(/^Pass 2 from B 3–4 /m);
		expect(parsed.flat).toMatch(wholePhrase('Pass 3 from A 5 units 1–8 corn (hybrid A); units 9–16 off 8'));
		expect(text).not.toMatch(/^Pass 4 /m);
		expect(text.indexOf('Pass 1 from A')).toBeLessThan(text.indexOf('Pass 2 from B'));
	});

	it('prints hazards, quantities, the sign-off line and every caution verbatim, cautions last', () => {
		expect(parsed.flat).toMatch(wholePhrase('• Tile outlet at the north end of lane 3'));
		expect(parsed.flat).toContain('Corn — hybrid A 3.6 units (288,000 seeds) 8.5 ac × 34,000 seeds/ac ÷ 80,000 per unit');
		expect(parsed.flat).toContain('Row units checked before the first pass:');
		expect(parsed.flat).toMatch(/\(name\) \(date\/time\)/);
		for (const caution of sheet.cautions) expect(parsed.flat).toContain(caution);
		const lastPage = parsed.pages[parsed.pages.length - 1].replace(/\s+/g, ' ');
		expect(lastPage.indexOf(sheet.cautions[1])).toBeGreaterThan(lastPage.indexOf('Row units checked'));
	});

	it('does not show the no-planter sentence when a planter is set up', () => {
		expect(parsed.flat).not.toContain('No planter set up');
	});

	it('gives the same bytes for the same sheet', async () => {
		const again = await renderSheetPdf(sheet, { timeZone: 'America/Chicago' });
		expect(again.equals(pdf)).toBe(true);
	});
});

describe('renderSheetPdf: a 640-acre section of 264 lanes, full lists asked for', () => {
	const sheet = buildSheet({ lanes: 264, lengthFt: 5280, wetSpotLanes: [100, 110] });
	let parsed: ParsedPdf;
	let short: ParsedPdf;

	beforeAll(async () => {
		parsed = await parsePdf(await renderSheetPdf(sheet, { appendix: true }));
		short = await parsePdf(await renderSheetPdf(sheet));
	});

	it('flows onto several pages, each numbered "Page N of M" with the field and season', () => {
		expect(parsed.pages.length).toBeGreaterThanOrEqual(8);
		expectPageNumbers(parsed, 'North Strips · 2027');
		// Without the appendix, lanes set up alike share a row and passes go four to a row.
		expect(short.pages.length).toBeLessThanOrEqual(3);
		expect(short.flat).toMatch(/Lanes 1, 3, 7 … 263 \(131\) corn 20 ft 8 × 30 in [\d.]+ hybrid A 34,000 Lanes 2, 4, 6 … 264 \(132\) soybean/);
		expect(short.flat).toContain('Lane 5 corn 20 ft 8 × 30 in 2.42 hybrid A 34,000 check strip');
		expect(short.flat).toMatch(/ 131 A 261–262 16 132 B 263–264 16 /);
		expect(short.flat).not.toContain('Appendix: the full lists');
	});

	it('lists all 264 lanes once each', () => {
		expectEveryLaneLine(parsed, sheet);
		const laneLines = parsed.pages.join('\n').match(/^Lane \d+ crop /gm) ?? [];
		expect(laneLines).toHaveLength(264);
	});

	it('repeats the table title and header row on every page a table continues onto', () => {
		const lanePages = parsed.pages.filter((p) => /^Lane \d+ crop /m.test(p));
		expect(lanePages.length).toBeGreaterThanOrEqual(4);
		for (const page of lanePages) expect(page).toMatch(/^Lane Kind Crop Width Rows Acres Variety Seeds\/ac Trial$/m);
		expect(lanePages.slice(1).every((p) => p.includes('Lanes (continued)'))).toBe(true);

		const passPages = parsed.pages.filter((p) => /^Pass \d+ from [AB] /m.test(p));
		expect(passPages.length).toBeGreaterThanOrEqual(2);
		for (const page of passPages) expect(page).toMatch(/^Done \/ Pass Start Lanes What the planter does Units on$/m);
		expect(passPages.slice(1).every((p) => p.includes('Passes, in driving order (continued)'))).toBe(true);
	});

	it('prints all 132 passes, alternating ends', () => {
		const text = parsed.pages.join('\n');
		const passLines = text.match(/^Pass \d+ from [AB] /gm) ?? [];
		expect(passLines).toHaveLength(132);
		expect(text).toMatch(/^Pass 131 from A 261–262 /m);
		expect(text).toMatch(/^Pass 132 from B 263–264 /m);
	});
});

describe('renderSheetPdf: farm with no planter', () => {
	it('still lists lanes, widths, crops and acres and says why passes are missing', async () => {
		const sheet = buildSheet({ lanes: 8, withPlanter: false });
		const parsed = await parsePdf(await renderSheetPdf(sheet));
		expect(parsed.pages[0].replace(/\s+/g, ' ')).toContain(NO_PLANTER);
		expect(NO_PLANTER).toBe('No planter set up for this farm yet: passes and row units are not shown.');
		expectEveryLaneLine(parsed, sheet);
		expect(parsed.flat).toMatch(wholePhrase(`Lane 3 crop corn 20 ft 8 × 30 in ${sheet.lanes[2].acres.toFixed(2)}`));
		expect(parsed.flat).not.toMatch(/Pass 1 from/);
		expect(parsed.flat).not.toContain('Row units:');
		expect(parsed.flat).not.toContain('Passes, in driving order');
		for (const caution of sheet.cautions) expect(parsed.flat).toContain(caution);
	});
});

describe('renderSheetPdf: text the font cannot draw', () => {
	it('renders "½", "✓", "→" and other symbols as plain text instead of crashing', async () => {
		const sheet = buildSheet({ lanes: 4 });
		sheet.fieldName = 'Back 40 ½ ✓';
		sheet.hazards = ['Culvert → east side ✓ marked', 'Wet ≥ 3 days after rain 🌧'];
		sheet.lanes[0].variety = 'hybrid ½ Ω';
		sheet.cautions = [...sheet.cautions, 'Keep ½ mile from the hives → call first'];
		const parsed = await parsePdf(await renderSheetPdf(sheet));
		expect(parsed.info.Title).toBe('Seeding sheet — Back 40 ½ ✓ 2027');
		expect(parsed.pages[0]).toContain('Seeding sheet — Back 40 1/2 ok 2027');
		expect(parsed.flat).toContain('Culvert -> east side ok marked');
		expect(parsed.flat).toContain('Wet >= 3 days after rain ?');
		expect(parsed.flat).toMatch(/Lane 1 crop corn 20 ft 8 × 30 in [\d.]+ hybrid 1\/2 \? 34,000/);
		expect(parsed.flat).toContain('Keep 1/2 mile from the hives -> call first');
		expect(parsed.flat).not.toMatch(/[½✓→≥Ω]/u);
	});

	it('cleans single characters as documented', () => {
		const latinOnly = (cp: number) => cp < 0x100 || cp === 0x2014;
		expect(sanitizeText('3½ in', latinOnly)).toBe('3 1/2 in');
		expect(sanitizeText('A→B', latinOnly)).toBe('A->B');
		expect(sanitizeText('✓ done', latinOnly)).toBe('ok done');
		expect(sanitizeText('Łódź', latinOnly)).toBe('?ódz');
		expect(sanitizeText('ü — é', latinOnly)).toBe('ü — é');
		expect(sanitizeText('tab\there\u0007', latinOnly)).toBe('tab here');
		expect(sanitizeText(null, latinOnly)).toBe('');
	});
});

describe('renderSheetPdf: edge cases', () => {
	it('renders a plan with no lanes, passes, checks or cautions on one page', async () => {
		const sheet = buildSheet({ lanes: 2, withPlanter: false });
		sheet.lanes = [];
		sheet.passes = [];
		sheet.checks = [];
		sheet.hazards = [];
		sheet.quantities = [];
		sheet.cautions = [];
		const parsed = await parsePdf(await renderSheetPdf(sheet));
		expect(parsed.pages).toHaveLength(1);
		expect(parsed.flat).toContain('This plan has no lanes.');
		expect(parsed.flat).toContain('No problems found.');
		expect(parsed.flat).not.toContain('STOP');
		expect(parsed.flat).toContain('Page 1 of 1');
	});

	it('skips broken lane shapes on the map but still lists the lanes', async () => {
		const sheet = buildSheet({ lanes: 3 });
		sheet.lanes[0].geometry = { type: 'MultiPolygon', coordinates: [] };
		sheet.lanes[1].geometry = { type: 'Polygon', coordinates: [[[NaN, 43.9], [-94.2, NaN], [-94.2, 43.9]]] };
		const parsed = await parsePdf(await renderSheetPdf(sheet));
		expectEveryLaneLine(parsed, sheet);
	});

	it('says "1 problem" for a single stop check', async () => {
		const sheet = buildSheet({ lanes: 2 });
		sheet.checks = sheet.checks.slice(0, 1);
		const parsed = await parsePdf(await renderSheetPdf(sheet));
		expect(parsed.pages[0]).toContain('STOP: 1 problem to fix before planting');
	});

	it('drops a summary\'s lane prefix only when it names the same lanes as the Lanes column', () => {
		expect(withoutLanePrefix('Lanes 1–2: units 1–8 corn', [0, 1])).toBe('units 1–8 corn');
		expect(withoutLanePrefix('Lane 4: units 1–8 corn', [3])).toBe('units 1–8 corn');
		expect(withoutLanePrefix('Lanes 1, 2, 3, 6: units 1–8 corn', [0, 1, 2, 5])).toBe('units 1–8 corn');
		expect(withoutLanePrefix('Lanes 1–2: units 1–8 corn', [0, 1, 2])).toBe('Lanes 1–2: units 1–8 corn');
		expect(withoutLanePrefix('Nothing planted; units 1–16 off', [4])).toBe('Nothing planted; units 1–16 off');
		expect(withoutLanePrefix('Lanes 1–2:', [0, 1])).toBe('Lanes 1–2:');
		expect(laneNumbers([5, 0, 1, 2, 2])).toBe('1–3, 6');
	});

	it('gives each crop its own letter code and look', () => {
		const sheet = buildSheet({ lanes: 2 });
		const lane = sheet.lanes[0];
		const styles = cropStyles([
			lane,
			{ ...lane, index: 1, crop: 'cover mix' },
			{ ...lane, index: 2, crop: 'Corn ' },
			{ ...lane, index: 3, crop: 'clover' }
		]);
		expect([...styles.values()].map((s) => s.code)).toEqual(['C', 'CM', 'Cl']);
		expect(new Set([...styles.values()].map((s) => s.pattern)).size).toBe(3);
		expect(new Set([...styles.values()].map((s) => s.fill)).size).toBe(3);
	});
});
