import { describe, expect, it } from 'vitest';
import { pairedDifference, studentTQuantile, welchDifference } from '$lib/harvest/stats';

// Student's sleep data: extra hours of sleep of 10 patients under two drugs, from Cushny & Peebles
// (1905) as analysed by Student (1908), "The probable error of a mean", Biometrika 6:1–25. The worked
// t tests are those R's documentation shows for t.test(extra ~ group, data = sleep) (R Core Team,
// "R: A Language and Environment for Statistical Computing", dataset `sleep`); the printed figures
// are quoted from memory and agree with SciPy 1.17's scipy.stats.ttest_rel / ttest_ind to 12 digits.
const drug1 = [0.7, -1.6, -0.2, -1.2, -0.1, 3.4, 3.7, 0.8, 0.0, 2.0];
const drug2 = [1.9, 0.8, 1.1, 0.1, -0.1, 4.4, 5.5, 1.6, 4.6, 3.4];

describe('95 % confidence intervals of a mean difference', () => {
	it('t quantiles match printed tables (two-sided 95 %: 12.706 at 1 df, 4.303 at 2, 2.262 at 9, 1.960 at ∞)', () => {
		expect(studentTQuantile(0.975, 1).toFixed(3)).toBe('12.706');
		expect(studentTQuantile(0.975, 2).toFixed(3)).toBe('4.303');
		expect(studentTQuantile(0.975, 9).toFixed(3)).toBe('2.262');
		expect(studentTQuantile(0.975, 1e7).toFixed(3)).toBe('1.960');
		expect(studentTQuantile(0.025, 9)).toBeCloseTo(-studentTQuantile(0.975, 9), 10);
	});

	it('paired: sleep data, mean difference −1.58, 95 % CI −2.4598858 to −0.7001142, t = −4.0621 on 9 df', () => {
		const r = pairedDifference(drug1.map((a, i) => ({ a, b: drug2[i] })));
		expect(r.difference).toBeCloseTo(-1.58, 10);
		expect(r.ci95![0].toFixed(7)).toBe('-2.4598858');
		expect(r.ci95![1].toFixed(7)).toBe('-0.7001142');
		expect(r.t!.toFixed(4)).toBe('-4.0621');
		expect(r.df).toBe(9);
		expect(r.replications).toBe(10);
		expect(r.warning).toBeNull();
	});

	it('Welch: sleep data as two groups, 95 % CI −3.3654832 to 0.2054832 on 17.776 df', () => {
		const r = welchDifference(drug1, drug2);
		expect(r.ci95![0].toFixed(7)).toBe('-3.3654832');
		expect(r.ci95![1].toFixed(7)).toBe('0.2054832');
		expect(r.df!.toFixed(3)).toBe('17.776');
		expect(r.t!.toFixed(4)).toBe('-1.8608');
	});

	it('warns under 3 replications and gives no interval from one', () => {
		const two = pairedDifference([{ a: 200, b: 190 }, { a: 210, b: 196 }]);
		expect(two.ci95).not.toBeNull();
		expect(two.warning).toBe('Only 2 replications: fewer than 3, so the interval is very wide and the difference may be chance.');
		const one = welchDifference([200], [190, 192]);
		expect(one.ci95).toBeNull();
		expect(one.replications).toBe(1);
		expect(one.warning).toBe('Only 1 replication: no confidence interval can be estimated; treat the difference as anecdote.');
		expect(pairedDifference([{ a: 1, b: 0 }, { a: 2, b: 1 }, { a: 3, b: 2 }]).warning).toBeNull();
	});
});
