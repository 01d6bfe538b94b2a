/**
 * Likelihood words for a trend, from one documented scheme only.
 *
 * Scheme: Hirsch, Archfield & De Cicco (2015), "A bootstrap method for estimating uncertainty of
 * water quality trends", Environmental Modelling & Software, doi:10.1016/j.envsoft.2015.07.017.
 * The bootstrap gives the probability of an upward trend, P(up) = (nPos + 0.5)/(nBoot + 1), and
 * P(down) = 1 − P(up). The descriptor bands are right-closed intervals:
 *   (0, 0.05] highly unlikely · (0.05, 0.10] very unlikely · (0.10, 0.33] unlikely ·
 *   (0.33, 0.66] about as likely as not · (0.66, 0.90] likely · (0.90, 0.95] very likely ·
 *   (0.95, 1] highly likely
 * (bands as coded by the authors in the USGS EGRETci package, functions wordLike/wBT).
 * The IPCC AR5 scale is not used anywhere, so the two schemes are never mixed.
 */

export type LikelihoodWord = 'highly unlikely' | 'very unlikely' | 'unlikely' | 'about as likely as not' | 'likely' | 'very likely' | 'highly likely';

/** Upper bounds (inclusive) of each band, in order. */
export const likelihoodBands: readonly { upTo: number; word: LikelihoodWord }[] = [
  { upTo: 0.05, word: 'highly unlikely' },
  { upTo: 0.1, word: 'very unlikely' },
  { upTo: 0.33, word: 'unlikely' },
  { upTo: 0.66, word: 'about as likely as not' },
  { upTo: 0.9, word: 'likely' },
  { upTo: 0.95, word: 'very likely' },
  { upTo: 1, word: 'highly likely' },
];

/** Word for a probability in [0, 1]; null when the probability is unknown or out of range. */
export function likelihoodWord(probability: number | null | undefined): LikelihoodWord | null {
  if (probability === null || probability === undefined || !Number.isFinite(probability)) return null;
  if (probability < 0 || probability > 1) return null;
  for (const band of likelihoodBands) {
    if (probability <= band.upTo) return band.word;
  }
  return 'highly likely';
}

/** P(up) from bootstrap counts, (nPos + 0.5)/(nBoot + 1), Hirsch et al. (2015). */
export function probabilityUpFromCounts(upwardResamples: number, resamples: number): number {
  return (upwardResamples + 0.5) / (resamples + 1);
}
