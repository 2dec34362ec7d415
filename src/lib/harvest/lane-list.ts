/** Lane numbers as people type them, 1-based: "3", "3, 5", "3-6". Returns 0-based indexes or an error. */
export function parseLaneList(text: string): { indexes: number[] } | { error: string } {
	const out = new Set<number>();
	const parts = text.split(/[\s,;]+/).filter(Boolean);
	if (!parts.length) return { error: 'Give the lane numbers, e.g. 3 or 3, 5 or 3-6.' };
	for (const p of parts) {
		const range = /^(\d{1,5})\s*[-–]\s*(\d{1,5})$/.exec(p);
		if (range) {
			const [a, b] = [Number(range[1]), Number(range[2])].sort((x, y) => x - y);
			if (a < 1 || b - a > 1000) return { error: `"${p}" is not a lane range.` };
			for (let i = a; i <= b; i++) out.add(i - 1);
		} else if (/^\d{1,5}$/.test(p) && Number(p) >= 1) out.add(Number(p) - 1);
		else return { error: `"${p}" is not a lane number (lanes are numbered from 1).` };
	}
	return { indexes: [...out].sort((a, b) => a - b) };
}
