// Numbers as the plan pages show them (en-US grouping, fixed decimals). Pure.
// toLocaleString builds a new Intl.NumberFormat on every call, which made a 63-lane table cost tens
// of milliseconds to render; one formatter per precision is reused instead.
const formatters = new Map<number, Intl.NumberFormat>();

/** `n` with thousands separators and exactly `decimals` decimals, e.g. 1234.5 → "1,234.50". */
export function formatNumber(n: number, decimals = 2): string {
	let f = formatters.get(decimals);
	if (!f) {
		f = new Intl.NumberFormat('en-US', { minimumFractionDigits: decimals, maximumFractionDigits: decimals });
		formatters.set(decimals, f);
	}
	return f.format(n);
}
