/** Thresholds of the yield-point cleaning rules (see yield-points.ts for what each rule means). Common practice; the values are ours. */
export const CLEANING = { minSpeedMph: 0.5, passStartSeconds: 8, passGapSeconds: 5, passTurnDegrees: 90, overlapShareOfSwath: 0.5 } as const;
