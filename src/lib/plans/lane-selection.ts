// Parses "1-4, 9, 12" (lane numbers as people count them) into lane indexes. Pure.

export function parseLaneList(text: string, laneCount: number): { indexes: number[] } | { error: string } {
	const out = new Set<number>();
	for (const part of text.split(',').map((s) => s.trim()).filter(Boolean)) {
		const m = part.match(/^(\d+)\s*(?:-|–|to)\s*(\d+)$/) ?? part.match(/^(\d+)$/);
		if (!m) return { error: `"${part}" is not a lane number or range like 3-8.` };
		const from = Number(m[1]);
		const to = Number(m[2] ?? m[1]);
		if (from < 1 || to > laneCount || from > to) return { error: `Lanes run from 1 to ${laneCount}; "${part}" is outside that.` };
		for (let n = from; n <= to; n++) out.add(n - 1);
	}
	if (!out.size) return { error: 'Name at least one lane, e.g. 1-4, 9.' };
	return { indexes: [...out].sort((a, b) => a - b) };
}
