/**
 * Homogeneity of trends across sites for the Regional Kendall test: the van Belle & Hughes (1984)
 * chi-square (Water Resour. Res. 20(1):127–136), χ²_homog = Σ_k Z_k² − K·Z̄², Z_k = S_k/√Var(S_k)
 * without continuity correction, df = K − 1, with sites in place of seasons (USGS practice for the
 * Regional Kendall test, Helsel & Frans 2006).
 */
import { describe, expect, test } from 'vitest';
import { regionalKendall } from '../../generator/stats/regional-kendall.ts';
import { statsTrendEngine } from '../../generator/model/trend-engine.ts';
import { assertInDelta } from '../asserts.ts';
import reference from '../reference/scipy-homogeneity.json' with { type: 'json' };

const sites = reference.sites.map((s) => ({ site: s.site, points: s.t.map((t, i) => ({ t, value: s.y[i] as number })) }));

describe('case 4: homogeneity of trends across places (van Belle & Hughes 1984)', () => {
  test('case 4: seven invented sites going both ways: χ², df and p equal SciPy (kendalltau Z, chi2.sf)', () => {
    const r = regionalKendall(sites);
    // Reference: test/reference/make-homogeneity-reference.py (SciPy 1.10.1). Z_k agree to about
    // 1e-12 (same variance formula); the tolerance allows for summing seven squares.
    assertInDelta(r?.heterogeneity?.chi2, reference.chi2, 1e-9);
    expect(r?.heterogeneity?.df).toBe(reference.df);
    assertInDelta(Math.log10(r?.heterogeneity?.p ?? 1), Math.log10(reference.p), 1e-6);
  });
  test('case 4: two sites with opposite trends, [5,6,7,8] and [8,7,6,5]: χ² 8.3077, df 1, p 0.0039 (EnvStats kendallSeasonalTrendTest Rd)', () => {
    const r = regionalKendall([
      { site: 'a', points: [5, 6, 7, 8].map((value, i) => ({ t: 2020 + i, value })) },
      { site: 'b', points: [8, 7, 6, 5].map((value, i) => ({ t: 2020 + i, value })) },
    ]);
    assertInDelta(r?.heterogeneity?.chi2, 8.3077, 5e-5);
    assertInDelta(r?.heterogeneity?.p, 0.0039, 5e-5);
  });
  test('case 4: the trend engine passes the homogeneity test on to the model', () => {
    const r = statsTrendEngine.regional(sites, { confidence: 0.95 });
    assertInDelta(r?.homogeneity?.chi2, reference.chi2, 1e-9);
    expect(r?.homogeneity?.df).toBe(6);
  });
});
