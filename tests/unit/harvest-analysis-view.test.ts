import { describe, expect, it } from 'vitest';
import { render } from 'svelte/server';
import HarvestAnalysisView from '$lib/components/harvest/HarvestAnalysisView.svelte';
import { checkComparisons, edgeEffects, landEquivalent, laneYields, varietyTrials, type AnalysisEntry, type AnalysisLane } from '$lib/harvest/analysis';
import { groundHistory } from '$lib/harvest/season-over-season';
import type { HarvestAnalysis } from '$lib/server/harvest-analysis';
import { rectangle } from '../fixtures/rectangle';

const lane = (i: number, crop: string, extra: Partial<AnalysisLane> = {}): AnalysisLane => ({
	laneIndex: i, kind: 'crop', crop, acres: 1, widthFt: 20, rows: 8, borderRows: 0, variety: null, trialLabel: null, ...extra
});

describe('harvest analysis as rendered on the server', () => {
	it('shows every section with its figures and units, user text as text', () => {
		const lanes = [
			lane(0, 'corn', { trialLabel: 'hybrid <b>block</b>', variety: 'hybrid A' }), lane(1, 'corn', { trialLabel: 'hybrid <b>block</b>', variety: 'hybrid B' }),
			lane(2, 'corn', { trialLabel: '30-in check' }), lane(3, 'corn', { widthFt: 60, rows: 12 }), lane(4, 'corn', { borderRows: 2 })
		];
		const entries: AnalysisEntry[] = [
			{ laneIndexes: [0], crop: 'corn', bushelsPerAcre: 201, harvestedAcres: 1, rowPosition: 'all' },
			{ laneIndexes: [1], crop: 'corn', bushelsPerAcre: 209, harvestedAcres: 1, rowPosition: 'all' },
			{ laneIndexes: [2], crop: 'corn', bushelsPerAcre: 207, harvestedAcres: 1, rowPosition: 'all' },
			{ laneIndexes: [3], crop: 'corn', bushelsPerAcre: 172, harvestedAcres: 1, rowPosition: 'all' },
			{ laneIndexes: [4], crop: 'corn', bushelsPerAcre: 230, harvestedAcres: 0.25, rowPosition: 'outside' },
			{ laneIndexes: [4], crop: 'corn', bushelsPerAcre: 200, harvestedAcres: 0.75, rowPosition: 'inside' }
		];
		const yields = laneYields(lanes, entries);
		const g = rectangle(20, 500);
		const analysis: HarvestAnalysis = {
			season: 2026, hasPlan: true, entries: entries.length, lanes: yields, edge: edgeEffects(yields, entries), trials: varietyTrials(yields),
			checks: checkComparisons(yields), ler: landEquivalent(yields), monitorImportId: null,
			history: groundHistory([{ laneIndex: 0, crop: 'corn', geometry: g }], [{ season: 2025, laneIndex: 0, crop: 'soybean', geometry: g, bushelsPerAcre: 58 }])
		};
		const { body } = render(HarvestAnalysisView, { props: { analysis, sole: {}, action: '/x' } });
		expect(body).toContain('Yield by lane');
		expect(body).toContain('Edge effect: outside rows against inside rows');
		expect(body).toContain('230.0 bu/ac');
		expect(body).toContain('Only 1 replication: no confidence interval can be estimated; treat the difference as anecdote.');
		expect(body).toContain('Varieties in trial blocks');
		expect(body).toContain('hybrid &lt;b>block&lt;/b> (corn)');
		expect(body).not.toContain('<b>block</b>');
		expect(body).toContain('Strips against the check strip');
		expect(body).toContain('corn check strip (8 rows on 30 in)');
		expect(body).toContain('The same ground in earlier seasons');
		expect(body).toContain('soybean 100 %');
		expect(body).toContain('58.0 bu/ac');
		expect(body).toMatch(/LER <strong class="tabular-nums">0\.\d\d<\/strong>/);
	});
});
