import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PDFParse } from 'pdf-parse';
import { createField } from '$lib/server/fields';
import { savePlan } from '$lib/server/plans';
import { createEquipment } from '$lib/server/equipment';
import { loadSheet } from '$lib/server/sheet';
import { emailSheet } from '$lib/server/sheet-mail';
import { renderSheetPdf } from '$lib/server/sheet-pdf';
import { requireMember } from '$lib/server/access';
import { startMailStandIn } from '../../scripts/stand-ins/smtp';
import type { CapturedMessage } from '$lib/mailbox';
import { fakeEvent, makeFarmWithTeam, thrown } from './helpers';
import { rectangle } from '../fixtures/rectangle';

// Its own ports, so it never meets the stand-in the end-to-end run starts later.
const SMTP_PORT = 2725;
const HTTP_PORT = 2726;
let mail: Awaited<ReturnType<typeof startMailStandIn>>;
const previousSmtp = process.env.SMTP_URL;
beforeAll(async () => {
	mail = await startMailStandIn({ host: '127.0.0.1', smtpPort: SMTP_PORT, httpPort: HTTP_PORT });
	process.env.SMTP_URL = `smtp://127.0.0.1:${SMTP_PORT}`;
});
afterAll(async () => {
	process.env.SMTP_URL = previousSmtp;
	await mail.close();
});


async function setup() {
	const { farm, members } = await makeFarmWithTeam();
	const access = await requireMember(fakeEvent(members.owner), farm.id, 'editPlans');
	const boundary = rectangle(235, 800, -94.25, 43.95);
	const field = await createField(access, { name: 'Sheet field', boundary, exclusions: [], farmNumber: null, tractNumber: null, fieldNumber: null, landlord: null, notes: null });
	const [sw, , , nw] = boundary.coordinates[0] as [number, number][];
	await savePlan(access, field.id, 2027, {
		guidance: { a: sw, b: nw },
		pattern: [{ kind: 'crop', crop: 'corn', rows: 8, rowSpacingIn: 30 }, { kind: 'crop', crop: 'soybean', rows: 8, rowSpacingIn: 30 }],
		offsetFt: 0, headlandFt: 0, version: 0, variant: 'main', assignments: [], notes: null, rebase: false
	});
	return { access, field, members, farm };
}

const splitPlanter = {
	name: '16-row split', kind: 'planter' as const, isDefaultPlanter: true, sections: null, rows: null, lengthFt: null, notes: null,
	planter: {
		rowSpacingIn: 30,
		fertilizerLines: [{ id: 'n', name: 'Nitrogen', product: 'UAN 32 %', forCrops: ['corn'], gallonsPerAcre: 15, poundsPerGallon: 11.06, percentN: 32 }],
		rowUnits: Array.from({ length: 16 }, (_, i) => ({ unit: i + 1, seed: { crop: i < 8 ? 'corn' : 'soybean', variety: null }, fertilizerOn: i < 8 ? ['n'] : [] }))
	}
};

async function pdfText(pdf: Buffer) {
	const parser = new PDFParse({ data: new Uint8Array(pdf) });
	const text = await parser.getText();
	await parser.destroy();
	return text;
}

describe('seeding sheet from the database', () => {
	it('uses the default planter and renders a PDF whose lane and pass lines read back', async () => {
		const { access, field } = await setup();
		await createEquipment(access, splitPlanter);
		const sheet = await loadSheet(access, field.id, 2027);
		expect(sheet.equipment?.name).toBe('16-row split');
		// 235 ft of 20-ft lanes: 11 whole and one 15-ft piece.
		expect(sheet.lanes).toHaveLength(12);
		const pdf = await renderSheetPdf(sheet, { timeZone: 'America/Chicago' });
		expect(pdf.subarray(0, 5).toString()).toBe('%PDF-');
		const text = await pdfText(pdf);
		expect(text.total).toBeGreaterThanOrEqual(1);
		// Whole table rows, read line by line: "Lane 1" must be its own row, not a piece of "Lane 10".
		const lines = text.text.split('\n');
		const laneRows = lines.filter((l) => /^Lane \d+ /.test(l)).map((l) => l.split(' ').slice(0, 6).join(' '));
		expect(laneRows).toEqual(sheet.lanes.map((l) => `Lane ${l.index + 1} ${l.kind} ${l.crop} 20 ft`));
		expect(laneRows).toHaveLength(12);
		const passRows = lines.filter((l) => /^Pass \d+ from [AB] /.test(l)).map((l) => l.split(' ').slice(0, 4).join(' '));
		expect(passRows).toEqual(sheet.passes.map((p) => `Pass ${p.number} from ${p.startsAt}`));
		expect(passRows).toHaveLength(6);
		expect(text.text).toContain('The label is the law');
	});

	it('still gives lanes, widths, crops and acres when the farm has no planter', async () => {
		const { access, field } = await setup();
		const sheet = await loadSheet(access, field.id, 2027);
		expect(sheet.equipment).toBeNull();
		const text = await pdfText(await renderSheetPdf(sheet));
		expect(text.text).toContain('No planter set up for this farm yet');
		expect(text.text).toMatch(/^Lane 1 crop corn 20 ft\b/m);
	});

	it('e-mails the PDF to the chosen crew through SMTP', async () => {
		const { access, field, members } = await setup();
		await createEquipment(access, splitPlanter);
		const sent = await emailSheet(access, field.id, 2027, [members.crew.id], {});
		expect(sent).toEqual({ to: [members.crew.email], queued: [] });
		const res = await fetch(`http://127.0.0.1:${HTTP_PORT}/messages?to=${encodeURIComponent(members.crew.email)}`);
		const [msg] = (await res.json()) as CapturedMessage[];
		expect(msg.subject).toBe('Seeding sheet: Sheet field 2027');
		expect(msg.attachments).toHaveLength(1);
		expect(msg.attachments[0]).toMatchObject({ filename: 'seeding-sheet-Sheet-field-2027.pdf', contentType: 'application/pdf' });
		const pdf = Buffer.from(msg.attachments[0].base64, 'base64');
		expect((await pdfText(pdf)).text).toContain('Seeding sheet');
	});

	it('refuses recipients who are not working members of the farm', async () => {
		const { access, field, members } = await setup();
		const other = await makeFarmWithTeam();
		expect((await thrown(() => emailSheet(access, field.id, 2027, [other.members.crew.id], {}))).status).toBe(400);
		expect((await thrown(() => emailSheet(access, field.id, 2027, [members.viewer.id], {}))).status).toBe(400);
		expect((await thrown(() => emailSheet(access, field.id, 2027, [], {}))).status).toBe(400);
	});
});
