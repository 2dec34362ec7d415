import { WGS84_A, WGS84_F } from './units';

/*
 * Geodesics on the WGS84 ellipsoid by T. Vincenty, "Direct and inverse solutions of geodesics on
 * the ellipsoid with application of nested equations", Survey Review 23(176):88–93, 1975.
 * Used only to place points on long boundary edges before measuring area.
 */
const A = WGS84_A;
const F = WGS84_F;
const B = A * (1 - F);
const DEG = Math.PI / 180;

/** Vincenty's Δσ series (Vincenty 1975, eq. 6), shared by the inverse and direct problems. */
function deltaSigma(bigB: number, sinSigma: number, cosSigma: number, cos2SigmaM: number): number {
	return (
		bigB * sinSigma *
		(cos2SigmaM +
			(bigB / 4) *
				(cosSigma * (-1 + 2 * cos2SigmaM * cos2SigmaM) -
					(bigB / 6) * cos2SigmaM * (-3 + 4 * sinSigma * sinSigma) * (-3 + 4 * cos2SigmaM * cos2SigmaM)))
	);
}

/** Inverse problem: distance (m) and initial azimuth (rad) from point 1 to point 2; null if it does not converge (near-antipodal). */
export function vincentyInverse(
	lon1: number,
	lat1: number,
	lon2: number,
	lat2: number
): { s: number; azimuth1: number } | null {
	const L = (lon2 - lon1) * DEG;
	const U1 = Math.atan((1 - F) * Math.tan(lat1 * DEG));
	const U2 = Math.atan((1 - F) * Math.tan(lat2 * DEG));
	const sinU1 = Math.sin(U1), cosU1 = Math.cos(U1), sinU2 = Math.sin(U2), cosU2 = Math.cos(U2);
	let lambda = L;
	for (let iter = 0; iter < 200; iter++) {
		const sinL = Math.sin(lambda), cosL = Math.cos(lambda);
		const sinSigma = Math.hypot(cosU2 * sinL, cosU1 * sinU2 - sinU1 * cosU2 * cosL);
		if (sinSigma === 0) return { s: 0, azimuth1: 0 };
		const cosSigma = sinU1 * sinU2 + cosU1 * cosU2 * cosL;
		const sigma = Math.atan2(sinSigma, cosSigma);
		const sinAlpha = (cosU1 * cosU2 * sinL) / sinSigma;
		const cos2Alpha = 1 - sinAlpha * sinAlpha;
		const cos2SigmaM = cos2Alpha === 0 ? 0 : cosSigma - (2 * sinU1 * sinU2) / cos2Alpha;
		const C = (F / 16) * cos2Alpha * (4 + F * (4 - 3 * cos2Alpha));
		const prev = lambda;
		lambda =
			L +
			(1 - C) * F * sinAlpha *
				(sigma + C * sinSigma * (cos2SigmaM + C * cosSigma * (-1 + 2 * cos2SigmaM * cos2SigmaM)));
		if (Math.abs(lambda - prev) < 1e-12) {
			const u2 = (cos2Alpha * (A * A - B * B)) / (B * B);
			const bigA = 1 + (u2 / 16384) * (4096 + u2 * (-768 + u2 * (320 - 175 * u2)));
			const bigB = (u2 / 1024) * (256 + u2 * (-128 + u2 * (74 - 47 * u2)));
			const dSigma = deltaSigma(bigB, sinSigma, cosSigma, cos2SigmaM);
			const s = B * bigA * (sigma - dSigma);
			const azimuth1 = Math.atan2(cosU2 * Math.sin(lambda), cosU1 * sinU2 - sinU1 * cosU2 * Math.cos(lambda));
			return { s, azimuth1 };
		}
	}
	return null;
}

/** Direct problem: the point [lng, lat] reached from point 1 along azimuth (rad) after s metres. */
export function vincentyDirect(lon1: number, lat1: number, azimuth1: number, s: number): [number, number] {
	const sinA1 = Math.sin(azimuth1), cosA1 = Math.cos(azimuth1);
	const tanU1 = (1 - F) * Math.tan(lat1 * DEG);
	const cosU1 = 1 / Math.sqrt(1 + tanU1 * tanU1), sinU1 = tanU1 * cosU1;
	const sigma1 = Math.atan2(tanU1, cosA1);
	const sinAlpha = cosU1 * sinA1;
	const cos2Alpha = 1 - sinAlpha * sinAlpha;
	const u2 = (cos2Alpha * (A * A - B * B)) / (B * B);
	const bigA = 1 + (u2 / 16384) * (4096 + u2 * (-768 + u2 * (320 - 175 * u2)));
	const bigB = (u2 / 1024) * (256 + u2 * (-128 + u2 * (74 - 47 * u2)));
	let sigma = s / (B * bigA);
	let cos2SigmaM = 0, sinSigma = 0, cosSigma = 0;
	for (let iter = 0; iter < 200; iter++) {
		cos2SigmaM = Math.cos(2 * sigma1 + sigma);
		sinSigma = Math.sin(sigma);
		cosSigma = Math.cos(sigma);
		const dSigma = deltaSigma(bigB, sinSigma, cosSigma, cos2SigmaM);
		const next = s / (B * bigA) + dSigma;
		if (Math.abs(next - sigma) < 1e-12) { sigma = next; break; }
		sigma = next;
	}
	cos2SigmaM = Math.cos(2 * sigma1 + sigma);
	sinSigma = Math.sin(sigma);
	cosSigma = Math.cos(sigma);
	const x = sinU1 * sinSigma - cosU1 * cosSigma * cosA1;
	const lat2 = Math.atan2(sinU1 * cosSigma + cosU1 * sinSigma * cosA1, (1 - F) * Math.hypot(sinAlpha, x));
	const lambda = Math.atan2(sinSigma * sinA1, cosU1 * cosSigma - sinU1 * sinSigma * cosA1);
	const C = (F / 16) * cos2Alpha * (4 + F * (4 - 3 * cos2Alpha));
	const L =
		lambda -
		(1 - C) * F * sinAlpha *
			(sigma + C * sinSigma * (cos2SigmaM + C * cosSigma * (-1 + 2 * cos2SigmaM * cos2SigmaM)));
	return [lon1 + L / DEG, lat2 / DEG];
}
