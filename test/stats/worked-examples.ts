/** Published worked examples used by several test files (data only). */

/** D. Little, "A Mann-Kendall Example (By Hand)", College of the Holy Cross: 14 values at times 1..14. */
export const littleValues = [12.9, 14.8, 13.2, 15.7, 13.8, 15.6, 12.9, 11.0, 17.3, 15.9, 19.0, 18.3, 20.1, 21.7];

/**
 * USEPA 2009 Unified Guidance (EPA 530/R-09-007) Example 17-6, sulfate (ppm), as in EnvStats
 * EPA.09.Ex.17.6.sulfate.df; time is the guidance's yy.m label, not a decimal year.
 */
export const sulfateTime = [89.6, 89.8, 90.1, 90.3, 90.6, 90.8, 91.1, 91.3, 91.6, 91.8, 92.1, 92.6, 93.1, 93.6, 94.1, 94.6, 95.1, 95.6, 95.8, 96.1, 96.3, 96.6, 96.8];
export const sulfateValue = [480, 450, 490, 520, 485, 510, 510, 530, 510, 560, 560, 540, 590, 550, 600, 700, 570, 610, 650, 620, 830, 720, 590];

/** USEPA 2009 Unified Guidance Example 14-10 (EnvStats EPA.09.Ex.14.8.df, Unadj.Conc), Jan–Dec of 1983, 1984, 1985. */
export const monthlyConcentration: Record<number, number[]> = {
  1983: [1.99, 2.1, 2.12, 2.12, 2.11, 2.15, 2.19, 2.18, 2.16, 2.08, 2.05, 2.08],
  1984: [2.01, 2.1, 2.17, 2.13, 2.13, 2.18, 2.25, 2.24, 2.22, 2.13, 2.08, 2.16],
  1985: [2.15, 2.17, 2.27, 2.23, 2.24, 2.26, 2.31, 2.32, 2.28, 2.22, 2.19, 2.22],
};
