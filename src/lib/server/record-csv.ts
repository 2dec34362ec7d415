// The season's records as a spreadsheet: one row per product line (one row for work without products).
import Papa from 'papaparse';
import { format } from 'date-fns';
import { TZDate } from '@date-fns/tz';
import type { SeasonRecord } from './records';
import { laneListText } from './record-build';
import { RECORD_TYPE_LABELS } from '../schemas/records';

const HEADERS = [
	'record id', 'type', 'started (local)', 'ended (local)', 'time zone', 'lanes', 'crops', 'acres (ac)',
	'product', 'EPA reg. no.', 'restricted use', 'rate', 'rate unit', 'total', 'total unit',
	'REI (h)', 'PHI (days)', 'grazing interval (days)', 'applicator', 'applicator cert. no.',
	'equipment', 'temperature (°F)', 'wind (mph)', 'wind from', 'location', 'notes'
];

// A spreadsheet runs a cell that starts with = + - @ as a formula: a leading apostrophe keeps it text.
const cell = (v: unknown) => {
	if (v == null) return '';
	const s = String(v);
	return /^[=+\-@\t\r]/.test(s) && !/^-?\d+(\.\d+)?$/.test(s) ? `'${s}` : s;
};

export function recordsCsv(records: SeasonRecord[], timeZone: string): string {
	const local = (iso: string) => format(new TZDate(new Date(iso).getTime(), timeZone), 'yyyy-MM-dd HH:mm');
	const rows: unknown[][] = [];
	for (const r of records) {
		const common = [r.id, RECORD_TYPE_LABELS[r.type], local(r.startedAt), local(r.endedAt), timeZone, laneListText(r.laneIndexes), [...new Set(r.lanes.map((l) => l.crop))].join('; '), r.acres];
		const tail = [r.applicator, r.applicatorCertNumber, r.equipment, r.weather.tempF, r.weather.windMph, r.weather.windFrom, r.location, r.notes];
		if (!r.products.length) rows.push([...common, '', '', '', '', '', '', '', '', '', '', ...tail]);
		for (const p of r.products) {
			rows.push([...common, p.productName, p.epaRegNo, p.restrictedUse ? 'yes' : 'no', p.rate, p.rateUnit, p.total, p.totalUnit, p.reiHours, p.phiDays, p.grazingDays, ...tail]);
		}
	}
	return Papa.unparse({ fields: HEADERS, data: rows.map((r) => r.map(cell)) }, { newline: '\r\n' }) + '\r\n';
}
