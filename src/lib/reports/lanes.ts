// Lane numbers as people read them in a report.

/** "3-7, 9" for lane numbers 3,4,5,6,7,9. */
export function laneRanges(numbers: number[]): string {
	const sorted = [...new Set(numbers)].sort((a, b) => a - b);
	const parts: string[] = [];
	for (let i = 0; i < sorted.length; i++) {
		let j = i;
		while (j + 1 < sorted.length && sorted[j + 1] === sorted[j] + 1) j++;
		parts.push(j > i ? `${sorted[i]}-${sorted[j]}` : String(sorted[i]));
		i = j;
	}
	return parts.join(', ');
}
