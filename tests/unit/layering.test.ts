// Lower modules do not reach up: the pure geometry and agronomy modules import nothing outside
// their own folder (packages aside), and equipment nothing from the sheet, server, components or
// routes. Imports are read with TypeScript's own pre-processor, not a hand-made pattern.
import { readdirSync, readFileSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import ts from 'typescript';
import { describe, expect, it } from 'vitest';

const ROOT = resolve(__dirname, '../..');
const LIB = join(ROOT, 'src/lib');

interface Rule {
	folder: string;
	/** Folders (relative to the project) a relative import may not land in. */
	forbidden: (target: string) => boolean;
}

const inside = (folder: string) => (target: string) => target === folder || target.startsWith(`${folder}/`);

const RULES: Rule[] = [
	{ folder: 'src/lib/geometry', forbidden: (t) => !inside('src/lib/geometry')(t) },
	{ folder: 'src/lib/agronomy', forbidden: (t) => !inside('src/lib/agronomy')(t) },
	{ folder: 'src/lib/equipment', forbidden: (t) => ['src/lib/sheet', 'src/lib/server', 'src/lib/components', 'src/routes'].some((f) => inside(f)(t)) }
];

function sourceFiles(dir: string): string[] {
	return readdirSync(dir, { withFileTypes: true }).flatMap((e) => {
		const path = join(dir, e.name);
		if (e.isDirectory()) return sourceFiles(path);
		return /\.(ts|js)$/.test(e.name) && !/\.d\.ts$/.test(e.name) ? [path] : [];
	});
}

/** Every import of one file that breaks its folder's rule, as "file → specifier". */
function upwardImports(file: string, text: string, rule: Rule): string[] {
	const found = ts.preProcessFile(text, true, true).importedFiles.map((f) => f.fileName);
	return found
		.filter((spec) => {
			// App aliases ($lib, $app, $env …) tie a pure module to SvelteKit: never allowed here.
			if (spec.startsWith('$')) return true;
			if (!spec.startsWith('.') && !spec.startsWith('/')) return false; // a package
			const target = relative(ROOT, resolve(dirname(file), spec));
			return rule.forbidden(target);
		})
		.map((spec) => `${relative(ROOT, file)} → ${spec}`);
}

describe('lower modules do not import upward', () => {
	for (const rule of RULES) {
		it(`${rule.folder} keeps to its rule`, () => {
			const files = sourceFiles(join(ROOT, rule.folder));
			expect(files.length).toBeGreaterThan(2);
			const bad = files.flatMap((f) => upwardImports(f, readFileSync(f, 'utf8'), rule));
			expect(bad).toEqual([]);
		});
	}

	it('the scan catches each kind of upward import', () => {
		const [geometry, , equipment] = RULES;
		const geo = join(LIB, 'geometry/example.ts');
		const eq = join(LIB, 'equipment/example.ts');
		expect(upwardImports(geo, "import { x } from '../agronomy/index';", geometry)).toEqual(['src/lib/geometry/example.ts → ../agronomy/index']);
		expect(upwardImports(geo, "import { x } from '$lib/geometry/index';", geometry)).toEqual(['src/lib/geometry/example.ts → $lib/geometry/index']);
		expect(upwardImports(geo, "export { y } from './area';\nimport * as turf from '@turf/turf';", geometry)).toEqual([]);
		expect(upwardImports(eq, "import type { SheetCheck } from '../sheet/types';", equipment)).toEqual(['src/lib/equipment/example.ts → ../sheet/types']);
		expect(upwardImports(eq, "const m = await import('../server/db');", equipment)).toEqual(['src/lib/equipment/example.ts → ../server/db']);
		expect(upwardImports(eq, "import x from '../../routes/+layout';", equipment)).toEqual(['src/lib/equipment/example.ts → ../../routes/+layout']);
		expect(upwardImports(eq, "import { equipmentFit } from '../geometry/index';", equipment)).toEqual([]);
	});
});
