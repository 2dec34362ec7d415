// Adds up the vitest runs' and Playwright's JSON reports into one closing line: "N passed, N failed".
import { readFileSync, existsSync } from 'node:fs';

let passed = 0;
let failed = 0;
let skipped = 0;
// Every argument but the last is a vitest report; the last is Playwright's.
const paths = process.argv.slice(2);
const playwrightPath = paths.pop();

for (const vitestPath of paths) {
	if (existsSync(vitestPath)) {
		const v = JSON.parse(readFileSync(vitestPath, 'utf8'));
		passed += v.numPassedTests ?? 0;
		failed += v.numFailedTests ?? 0;
		skipped += (v.numPendingTests ?? 0) + (v.numTodoTests ?? 0);
		// A file that failed to load counts as one failure: its tests never ran.
		for (const f of v.testResults ?? []) if (f.status === 'failed' && (f.assertionResults ?? []).length === 0) failed++;
	} else {
		console.error(`missing ${vitestPath}: vitest did not report`);
		failed++;
	}
}

if (existsSync(playwrightPath)) {
	const p = JSON.parse(readFileSync(playwrightPath, 'utf8'));
	passed += p.stats?.expected ?? 0;
	failed += (p.stats?.unexpected ?? 0) + (p.stats?.flaky ?? 0);
	skipped += p.stats?.skipped ?? 0;
	failed += (p.errors ?? []).length;
} else {
	console.error(`missing ${playwrightPath}: Playwright did not report`);
	failed++;
}

console.log(`${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}`);
process.exit(failed > 0 ? 1 : 0);
