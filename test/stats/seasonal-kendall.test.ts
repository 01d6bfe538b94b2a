import { describe, expect, test } from 'vitest';
import { seasonalKendall, seasonCovariance, type SeasonGroup } from '../../generator/stats/seasonal-kendall.ts';
import { regionalKendall } from '../../generator/stats/regional-kendall.ts';
import { kendallVariance } from '../../generator/stats/kendall-variance.ts';
import { assertInDelta } from '../asserts.ts';
import datasets from '../reference/datasets.json' with { type: 'json' };
import scipyReference from '../reference/scipy-reference.json' with { type: 'json' };
import { monthlyConcentration } from './worked-examples.ts';

const f = (values: number[]) => Float64Array.from(values);

function monthlyGroups(): SeasonGroup[] {
  return Array.from({ length: 12 }, (_, month) => ({
    season: String(month + 1),
    t: f([1983, 1984, 1985]),
    y: f([1983, 1984, 1985].map((year) => monthlyConcentration[year]?.[month] as number)),
  }));
}

function tableGroups(name: 'nottem' | 'co2'): SeasonGroup[] {
  const data = datasets[name];
  return Array.from({ length: 12 }, (_, month) => {
    const rows = data.season.flatMap((season, i) => (season === month + 1 ? [i] : []));
    return { season: String(month + 1), t: f(rows.map((i) => data.t[i] as number)), y: f(rows.map((i) => data.y[i] as number)) };
  });
}

describe('seasonalKendall', () => {
  test('USEPA 2009 Example 14-10: S′ 35, Var 43, z 5.184951, p 2.160712e-07, tau 0.9722222, slope 0.06, CI 0.05786914–0.07213086, χ²het 0.1071882 df 11 (EnvStats kendallSeasonalTrendTest)', () => {
    const r = seasonalKendall(monthlyGroups());
    expect(r.S).toBe(35);
    assertInDelta(r.varS, 43, 1e-9);
    assertInDelta(r.z, 5.184951, 5e-7);
    assertInDelta(r.p, 2.160712e-7, 5e-13);
    // Convention: EnvStats prints S′/Σ n0 (tau-a form) → our tauA; our tau pools tau-b denominators
    assertInDelta(r.tauA, 0.9722222, 5e-8);
    assertInDelta(r.slope, 0.06, 1e-12);
    assertInDelta(r.lower, 0.05786914, 5e-9);
    assertInDelta(r.upper, 0.07213086, 5e-9);
    assertInDelta(r.heterogeneity?.chi2, 0.1071882, 5e-8);
    expect(r.heterogeneity?.df).toBe(11);
  });

  test('seasons [5,6,7,8] and [8,7,6,5]: S′ 0, p 1; χ²het 8.3077, df 1, p 0.0039 (EnvStats Rd; χ² recomputed)', () => {
    const r = seasonalKendall([
      { season: 'a', t: f([1, 2, 3, 4]), y: f([5, 6, 7, 8]) },
      { season: 'b', t: f([1, 2, 3, 4]), y: f([8, 7, 6, 5]) },
    ]);
    expect(r.S).toBe(0);
    expect(r.p).toBe(1);
    assertInDelta(r.heterogeneity?.chi2, 8.3077, 5e-5);
    expect(r.heterogeneity?.df).toBe(1);
    assertInDelta(r.heterogeneity?.p, 0.0039, 5e-5);
  });

  test('identical seasons: the Hirsch & Slack covariance equals the variance (Dietz & Killeen 1981, by formula)', () => {
    const cells = [3, 1, 4, 1.5, 9, 2.6].map((value) => ({ value, censored: false }));
    assertInDelta(seasonCovariance(cells, cells), kendallVariance(6, [], []), 1e-12);
  });

  test('a missing year takes the mid rank and adds nothing to K (Hirsch & Slack 1984)', () => {
    const a = [1, 2, 3].map((value) => ({ value, censored: false }));
    const b = [{ value: 1, censored: false }, null, { value: 3, censored: false }];
    // K = sgn((2−1)··) skipped pairs with a gap: only (1,3): (3−1)(3−1) > 0 → 1
    // ranks a: 1,2,3; b: 1, (2+1)/2 = 1.5, 2 → Σ R R = 1 + 3 + 6 = 10
    // σ = [1 + 40 − 3·4·3]/3 = 5/3
    assertInDelta(seasonCovariance(a, b), 5 / 3, 1e-12);
  });
});

describe('seasonalKendall against SciPy mstats.kendalltau_seasonal (SciPy 1.10.1, committed)', () => {
  for (const name of ['nottem', 'co2'] as const) {
    test(`${name} (years × months)`, () => {
      const ref = scipyReference[name].kendalltau_seasonal;
      const r = seasonalKendall(tableGroups(name));
      // independent seasons: continuity-corrected z, two-sided p (same convention)
      assertInDelta(r.p, ref['global p-value (indep)'], Math.max(1e-15, ref['global p-value (indep)'] * 1e-9));
      // dependent seasons: Hirsch & Slack covariance (same formula)
      assertInDelta(r.pCovariance, ref['global p-value (dep)'], ref['global p-value (dep)'] * 1e-9);
      // SciPy's "global tau (alt)" = S′/Σ seasonal tau-b denominators = our tau
      assertInDelta(r.tau, ref['global tau (alt)'], 1e-12);
      // Convention: SciPy's "chi2 total" uses continuity-corrected seasonal z; recompute it from our S_g, Var(S_g)
      const corrected = r.seasons.map((s) => (Math.sign(s.S) * (Math.abs(s.S) - 1)) / Math.sqrt(s.varS));
      assertInDelta(
        corrected.reduce((sum, z) => sum + z * z, 0),
        ref['chi2 total'],
        1e-9 * ref['chi2 total'],
      );
    });
  }
});

describe('regionalKendall (Helsel & Frans 2006: sites as seasons)', () => {
  test('two sites equal the seasonal test on the same groups', () => {
    const sites = [
      { site: 'north', points: [1, 2, 3, 4, 5].map((t, i) => ({ t, value: [2, 3, 3.5, 5, 4][i] as number })) },
      { site: 'south', points: [1, 2, 3, 4, 5].map((t, i) => ({ t, value: [7, 6, 8, 9, 9.5][i] as number })) },
    ];
    const regional = regionalKendall(sites);
    const seasonal = seasonalKendall(sites.map((s) => ({ season: s.site, t: f(s.points.map((p) => p.t)), y: f(s.points.map((p) => p.value)) })));
    expect(regional).toEqual(seasonal);
    expect(regional?.S).toBe(8 + 8); // north: 4 + 3 + 2 − 1; south: 2 + 3 + 2 + 1
  });
  test('no site with 2 values: null', () => {
    expect(regionalKendall([{ site: 'a', points: [{ t: 1, value: 1 }] }])).toBeNull();
  });
});
