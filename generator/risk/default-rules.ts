/**
 * The default rule table for levels, used when a scenario's settings give no `riskRules`.
 * Each rule compares one measure of one indicator with a threshold; the highest level among the
 * matching rules wins and an empty match leaves the level at "scant" (see assess-level.ts).
 *
 * Sources of the thresholds:
 * - 20 items per 100 m of beach: the EU coastline threshold value for macro litter under the Marine
 *   Strategy Framework Directive; compliance is judged on the median (Van Loon et al. 2020, JRC,
 *   "A European Threshold Value and Assessment Method for Macro Litter on Coastlines"). It is a
 *   benchmark for EU coasts (the 15th percentile of the 2015–2016 baseline), not a legal limit, so
 *   the texts call it "the threshold value used in the European Union", never a limit.
 * - 150 items per 100 m: the mean abundance over all EU beaches in the 2015–2016 baseline of the
 *   same report.
 * - 400 items per 100 m: our own choice, twenty times the threshold value.
 * - Clean Coast Index classes (Alkalay, Pasternak & Zask 2007, Ocean & Coastal Management
 *   50:352–362): 0–2 very clean, 2–5 clean, 5–10 moderate, 10–20 dirty, over 20 extremely dirty.
 *   Whether a boundary belongs to the class above or below is not stated there (from secondary
 *   sources); we count a boundary value in the cleaner class.
 * - Shellfish tissue 1 particle per g wet weight: most published studies report less than this
 *   (Danopoulos et al. 2020, Environmental Health Perspectives 128(12):126002, meta-analysis). It
 *   marks how much plastic is found, not a food-safety limit: no such limit exists.
 * - Region percentiles 75 and 90 of modelled arrivals per km, and the likelihood rules: our own
 *   choices. A likelihood rule only counts where the rise also passes the false-discovery check.
 */
import type { RiskRule } from '../scenario/settings.ts';

export const defaultRiskRules: readonly RiskRule[] = [
  {
    id: 'litter-at-eu-threshold',
    level: 'noticeable',
    indicator: 'beach-litter',
    measure: 'assessment-median',
    op: '>=',
    value: 20,
    text: 'Beach litter in the last four seasons has a median of {value} items per 100 m. That is at or above the threshold value used in the European Union ({threshold} items per 100 m), a yardstick and not a legal limit.',
    source: 'Van Loon et al. 2020, threshold value for coastline macro litter used in the European Union (a benchmark, not a legal limit)',
  },
  {
    id: 'litter-at-eu-mean',
    level: 'marked',
    indicator: 'beach-litter',
    measure: 'assessment-median',
    op: '>=',
    value: 150,
    text: 'Beach litter in the last four seasons has a median of {value} items per 100 m. That is at or above {threshold}, the average over beaches in the European Union in 2015 and 2016.',
    source: 'Van Loon et al. 2020, EU baseline mean 2015–2016',
  },
  {
    id: 'litter-far-above-threshold',
    level: 'heavy',
    indicator: 'beach-litter',
    measure: 'assessment-median',
    op: '>=',
    value: 400,
    text: 'Beach litter in the last four seasons has a median of {value} items per 100 m. That is at or above {threshold}, twenty times the threshold value used in the European Union.',
    source: 'Our own choice: twenty times the EU threshold value',
  },
  {
    id: 'clean-coast-moderate',
    level: 'noticeable',
    indicator: 'beach-litter',
    measure: 'clean-coast-index',
    op: '>',
    value: 5,
    text: 'The Clean Coast Index is {value}, above {threshold}: the beach is not clean.',
    source: 'Alkalay et al. 2007, Clean Coast Index class "moderate"',
  },
  {
    id: 'clean-coast-dirty',
    level: 'marked',
    indicator: 'beach-litter',
    measure: 'clean-coast-index',
    op: '>',
    value: 10,
    text: 'The Clean Coast Index is {value}, above {threshold}: the beach is dirty.',
    source: 'Alkalay et al. 2007, Clean Coast Index class "dirty"',
  },
  {
    id: 'clean-coast-extremely-dirty',
    level: 'heavy',
    indicator: 'beach-litter',
    measure: 'clean-coast-index',
    op: '>',
    value: 20,
    text: 'The Clean Coast Index is {value}, above {threshold}: the beach is very dirty.',
    source: 'Alkalay et al. 2007, Clean Coast Index class "extremely dirty"',
  },
  {
    id: 'arrivals-top-quarter',
    level: 'noticeable',
    indicator: 'drift-arrivals',
    measure: 'region-percentile',
    op: '>=',
    value: 75,
    text: 'In the drift model, more modelled particles per km reach this place than {value}% of the places on this coast. This shows where floating litter tends to go, not how much there is.',
    source: 'Our own choice: top quarter of the region',
  },
  {
    id: 'arrivals-top-tenth',
    level: 'marked',
    indicator: 'drift-arrivals',
    measure: 'region-percentile',
    op: '>=',
    value: 90,
    text: 'In the drift model, more modelled particles per km reach this place than {value}% of the places on this coast. This shows where floating litter tends to go, not how much there is.',
    source: 'Our own choice: top tenth of the region',
  },
  {
    id: 'shellfish-above-most-studies',
    level: 'noticeable',
    indicator: 'shellfish-tissue',
    measure: 'assessment-median',
    op: '>=',
    value: 1,
    text: 'Shellfish here hold a median of {value} plastic particles per gram. Most studies find less than {threshold}. This is not a food safety limit: none exists.',
    source: 'Danopoulos et al. 2020: most studies report less than 1 particle per g',
  },
  {
    id: 'water-top-tenth',
    level: 'noticeable',
    indicator: 'water-microplastics',
    measure: 'region-percentile',
    op: '>=',
    value: 90,
    text: 'The water here holds more plastic particles than at {value}% of the places on this coast.',
    source: 'Our own choice: top tenth of the region',
  },
  {
    id: 'litter-rise-likely',
    level: 'noticeable',
    indicator: 'beach-litter',
    measure: 'probability-up',
    op: '>=',
    value: 0.9,
    text: 'Beach litter is going up, and the chance of a rise is {value}.',
    source: 'Our own choice; Hirsch et al. 2015 likelihood bands',
  },
  {
    id: 'shellfish-rise-likely',
    level: 'noticeable',
    indicator: 'shellfish-tissue',
    measure: 'probability-up',
    op: '>=',
    value: 0.9,
    text: 'Plastic in shellfish is going up, and the chance of a rise is {value}.',
    source: 'Our own choice; Hirsch et al. 2015 likelihood bands',
  },
];
