// Mean differences with 95 % confidence intervals from Student's t distribution.
// The distribution comes from the regularized incomplete beta function (continued fraction by the
// modified Lentz method, as in Press et al., "Numerical Recipes", 3rd ed., Cambridge Univ. Press 2007, §6.4).

function logGamma(x: number): number {
	// Lanczos approximation (g = 7, n = 9), accurate to about 15 digits for x > 0.
	const c = [0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059, 12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7];
	if (x < 0.5) return Math.log(Math.PI / Math.sin(Math.PI * x)) - logGamma(1 - x);
	x -= 1;
	let a = c[0];
	const t = x + 7.5;
	for (let i = 1; i < 9; i++) a += c[i] / (x + i);
	return 0.5 * Math.log(2 * Math.PI) + (x + 0.5) * Math.log(t) - t + Math.log(a);
}

function betaContinuedFraction(a: number, b: number, x: number): number {
	const tiny = 1e-300;
	let c = 1;
	let d = 1 - ((a + b) * x) / (a + 1);
	if (Math.abs(d) < tiny) d = tiny;
	d = 1 / d;
	let h = d;
	for (let m = 1; m <= 300; m++) {
		const m2 = 2 * m;
		let aa = (m * (b - m) * x) / ((a + m2 - 1) * (a + m2));
		d = 1 + aa * d;
		if (Math.abs(d) < tiny) d = tiny;
		c = 1 + aa / c;
		if (Math.abs(c) < tiny) c = tiny;
		d = 1 / d;
		h *= d * c;
		aa = (-(a + m) * (a + b + m) * x) / ((a + m2) * (a + m2 + 1));
		d = 1 + aa * d;
		if (Math.abs(d) < tiny) d = tiny;
		c = 1 + aa / c;
		if (Math.abs(c) < tiny) c = tiny;
		d = 1 / d;
		const step = d * c;
		h *= step;
		if (Math.abs(step - 1) < 1e-15) break;
	}
	return h;
}

/** Regularized incomplete beta I_x(a, b). */
export function incompleteBeta(x: number, a: number, b: number): number {
	if (x <= 0) return 0;
	if (x >= 1) return 1;
	const front = Math.exp(logGamma(a + b) - logGamma(a) - logGamma(b) + a * Math.log(x) + b * Math.log(1 - x));
	return x < (a + 1) / (a + b + 2) ? (front * betaContinuedFraction(a, b, x)) / a : 1 - (front * betaContinuedFraction(b, a, 1 - x)) / b;
}

/** P(T ≤ t) for Student's t with `df` degrees of freedom (df may be fractional, as Welch's is). */
export function studentTCdf(t: number, df: number): number {
	const tail = 0.5 * incompleteBeta(df / (df + t * t), df / 2, 0.5);
	return t >= 0 ? 1 - tail : tail;
}

/** The t value with P(T ≤ t) = p, by bisection on the distribution function. */
export function studentTQuantile(p: number, df: number): number {
	if (!(p > 0 && p < 1) || !(df > 0)) throw new RangeError(`t quantile needs 0 < p < 1 and df > 0 (got p ${p}, df ${df})`);
	if (p < 0.5) return -studentTQuantile(1 - p, df);
	let lo = 0;
	let hi = 1;
	while (studentTCdf(hi, df) < p) hi *= 2;
	for (let i = 0; i < 200 && hi - lo > 1e-12 * Math.max(1, hi); i++) {
		const mid = (lo + hi) / 2;
		if (studentTCdf(mid, df) < p) lo = mid;
		else hi = mid;
	}
	return (lo + hi) / 2;
}

export const mean = (xs: number[]) => xs.reduce((s, x) => s + x, 0) / xs.length;

/** Sample variance (n − 1 in the denominator). */
export function variance(xs: number[]): number {
	const m = mean(xs);
	return xs.reduce((s, x) => s + (x - m) ** 2, 0) / (xs.length - 1);
}

/** Fewer replications than this and a comparison carries a warning (common practice in on-farm trials). */
export const MIN_REPLICATIONS = 3;

export interface MeanDifference {
	/** paired: differences within each replication; unpaired: Welch's two-sample t. */
	method: 'paired' | 'welch';
	/** Replications behind the comparison (pairs, or the smaller group's size). */
	replications: number;
	nA: number;
	nB: number;
	meanA: number;
	meanB: number;
	/** mean of A − mean of B */
	difference: number;
	/** 95 % confidence interval of the difference; null when there are too few values to estimate it. */
	ci95: [number, number] | null;
	df: number | null;
	t: number | null;
	warning: string | null;
}

function warningFor(reps: number, ci: boolean): string | null {
	if (!ci) return `Only ${reps} replication${reps === 1 ? '' : 's'}: no confidence interval can be estimated; treat the difference as anecdote.`;
	if (reps < MIN_REPLICATIONS) return `Only ${reps} replications: fewer than ${MIN_REPLICATIONS}, so the interval is very wide and the difference may be chance.`;
	return null;
}

/**
 * Mean of (a − b) over paired replications with its 95 % confidence interval:
 * d̄ ± t(0.975, n − 1) × s_d ÷ √n. Student (1908), "The probable error of a mean", Biometrika 6:1–25.
 */
export function pairedDifference(pairs: { a: number; b: number }[]): MeanDifference {
	const n = pairs.length;
	const d = pairs.map((p) => p.a - p.b);
	const meanA = n ? mean(pairs.map((p) => p.a)) : NaN;
	const meanB = n ? mean(pairs.map((p) => p.b)) : NaN;
	const diff = n ? mean(d) : NaN;
	if (n < 2) return { method: 'paired', replications: n, nA: n, nB: n, meanA, meanB, difference: diff, ci95: null, df: null, t: null, warning: warningFor(n, false) };
	const se = Math.sqrt(variance(d) / n);
	const df = n - 1;
	const q = studentTQuantile(0.975, df);
	return {
		method: 'paired', replications: n, nA: n, nB: n, meanA, meanB, difference: diff,
		ci95: [diff - q * se, diff + q * se], df, t: se > 0 ? diff / se : null, warning: warningFor(n, true)
	};
}

/**
 * Difference of two group means (a − b) with a 95 % confidence interval by Welch's t, which does not
 * assume equal variances: B. L. Welch (1947), Biometrika 34:28–35; df by the Welch–Satterthwaite equation.
 */
export function welchDifference(a: number[], b: number[]): MeanDifference {
	const nA = a.length;
	const nB = b.length;
	const meanA = nA ? mean(a) : NaN;
	const meanB = nB ? mean(b) : NaN;
	const diff = meanA - meanB;
	const reps = Math.min(nA, nB);
	if (nA < 2 || nB < 2) return { method: 'welch', replications: reps, nA, nB, meanA, meanB, difference: diff, ci95: null, df: null, t: null, warning: warningFor(reps, false) };
	const va = variance(a) / nA;
	const vb = variance(b) / nB;
	const se = Math.sqrt(va + vb);
	if (se === 0) {
		return { method: 'welch', replications: reps, nA, nB, meanA, meanB, difference: diff, ci95: [diff, diff], df: nA + nB - 2, t: null, warning: warningFor(reps, true) };
	}
	const df = (va + vb) ** 2 / (va ** 2 / (nA - 1) + vb ** 2 / (nB - 1));
	const q = studentTQuantile(0.975, df);
	return {
		method: 'welch', replications: reps, nA, nB, meanA, meanB, difference: diff,
		ci95: [diff - q * se, diff + q * se], df, t: diff / se, warning: warningFor(reps, true)
	};
}
