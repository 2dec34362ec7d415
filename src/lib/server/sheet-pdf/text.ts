// Text clean-up and number formats for the printed sheet.

/** Characters the sheet always writes in plain form, whatever the font holds. */
const PLAIN_FORMS: Record<string, string> = {
	'½': '1/2',
	'¼': '1/4',
	'¾': '3/4',
	'⅓': '1/3',
	'⅔': '2/3',
	'⅛': '1/8',
	'✓': 'ok',
	'✔': 'ok',
	'☑': '[x]',
	'☐': '[ ]',
	'✗': 'x',
	'✘': 'x',
	'→': '->',
	'←': '<-',
	'↔': '<->',
	'⇒': '=>',
	'≥': '>=',
	'≤': '<=',
	'≠': '!=',
	'≈': '~',
	'\t': ' '
};

const CONTROL = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F-\u009F]/g;
const COMBINING = /[\u0300-\u036f]/g;

/**
 * Returns text the embedded font can draw: known symbols become plain forms
 * ("½" → "1/2", "→" → "->"), accented letters the font lacks lose their accent,
 * anything else becomes "?". Never throws.
 */
export function sanitizeText(text: unknown, hasGlyph: (codePoint: number) => boolean): string {
	const source = String(text ?? '')
		.normalize('NFC')
		.replace(/\r\n?/g, '\n')
		.replace(CONTROL, '');
	let out = '';
	for (const char of source) {
		const plain = PLAIN_FORMS[char];
		if (plain !== undefined) {
			// "3½" reads "3 1/2", not "31/2"
			if (/^\d\//.test(plain) && /\d$/.test(out)) out += ' ';
			out += plain;
			continue;
		}
		if (char === '\n' || hasGlyph(char.codePointAt(0)!)) {
			out += char;
			continue;
		}
		const stripped = char.normalize('NFD').replace(COMBINING, '');
		out += stripped && stripped !== char && [...stripped].every((c) => hasGlyph(c.codePointAt(0)!)) ? stripped : '?';
	}
	return out;
}

const grouped = (digits: number) => new Intl.NumberFormat('en-US', { maximumFractionDigits: digits, minimumFractionDigits: 0 });
const fixed = (digits: number) =>
	new Intl.NumberFormat('en-US', { maximumFractionDigits: digits, minimumFractionDigits: digits });

/** "20 ft", "12.83 ft" */
export function formatFeet(feet: number): string {
	return `${grouped(2).format(feet)} ft`;
}

/** Acres with two decimals: "7.27" */
export function formatAcres(acres: number): string {
	return fixed(2).format(acres);
}

/** "34,000" or an empty string when not set */
export function formatPopulation(seedsPerAcre: number | null): string {
	return seedsPerAcre === null ? '' : grouped(0).format(seedsPerAcre);
}

/** Lane numbers as people read them (index + 1), runs joined: [0,1,2,5] → "1–3, 6" */
export function laneNumbers(indexes: number[]): string {
	const sorted = [...new Set(indexes)].sort((a, b) => a - b).map((i) => i + 1);
	const parts: string[] = [];
	for (let i = 0; i < sorted.length; ) {
		let j = i;
		while (j + 1 < sorted.length && sorted[j + 1] === sorted[j] + 1) j++;
		parts.push(j === i ? `${sorted[i]}` : `${sorted[i]}–${sorted[j]}`);
		i = j + 1;
	}
	return parts.join(', ');
}

/** "Apr 12, 2026, 6:30 AM CDT" in the given time zone (the server's own when none is given). */
export function formatPrintedAt(date: Date, timeZone?: string): string {
	return new Intl.DateTimeFormat('en-US', {
		timeZone,
		year: 'numeric',
		month: 'short',
		day: 'numeric',
		hour: 'numeric',
		minute: '2-digit',
		timeZoneName: 'short'
	}).format(date);
}

/** "1 problem" / "3 problems" */
export function countOf(n: number, singular: string, plural = `${singular}s`): string {
	return `${n} ${n === 1 ? singular : plural}`;
}
