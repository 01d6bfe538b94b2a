/**
 * Scenario settings: the one settings file of a scenario (listed in datapackage.json as the
 * resource named "settings"). Validated with zod; `schema/scenario.schema.json` is the same
 * schema published for editors.
 */
import { z } from 'zod';

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'an ISO 8601 date (YYYY-MM-DD)');
const slug = z.string().regex(/^[a-z0-9][a-z0-9-]{0,62}$/, 'a lower-case slug: letters, digits and hyphens');

export const contactSchema = z.object({
  role: z.enum(['shellfish-sanitation', 'public-health', 'debris-report', 'publisher', 'wildlife-rescue']),
  name: z.string().min(1),
  phone: z.string().optional(),
  email: z.string().optional(),
  url: z.string().optional(),
});

export const seasonDefinitionSchema = z.object({
  id: slug, // "winter"
  label: z.string().min(1), // "Winter"
  months: z.array(z.number().int().min(1).max(12)).min(1),
});

/** Four meteorological seasons; winter of year Y runs from December of Y−1 to February of Y. */
export const defaultSeasons = [
  { id: 'winter', label: 'Winter', months: [12, 1, 2] },
  { id: 'spring', label: 'Spring', months: [3, 4, 5] },
  { id: 'summer', label: 'Summer', months: [6, 7, 8] },
  { id: 'autumn', label: 'Autumn', months: [9, 10, 11] },
];

export const riskRuleSchema = z.object({
  id: slug,
  /** The level this rule sets when it matches; the highest matching rule wins. */
  level: z.enum(['scant', 'noticeable', 'marked', 'heavy']),
  indicator: z.enum(['beach-litter', 'water-microplastics', 'shellfish-tissue', 'wildlife-reports', 'drift-arrivals']),
  /** What is compared: the assessment median, the Clean Coast Index, the region percentile, or the likelihood of a rise. */
  measure: z.enum(['assessment-median', 'clean-coast-index', 'region-percentile', 'probability-up']),
  op: z.enum(['>=', '>', '<=', '<']),
  value: z.number(),
  /** Plain words shown under "why this level"; {value} and {threshold} are filled in. */
  text: z.string().min(1),
  source: z.string().optional(),
});

export const settingsSchema = z.object({
  $schema: z.string().optional(),
  invented: z.boolean().default(false),
  /**
   * Which notice every page carries: 'demo' (invented coast and figures), 'test-data' (real places,
   * made-up figures), 'provisional' (real figures not yet checked) or 'none'. Without it,
   * invented: true gives 'demo' and false gives 'none'.
   */
  dataNotice: z.enum(['demo', 'test-data', 'provisional', 'none']).optional(),
  region: z.object({ id: slug, name: z.string().min(1), description: z.string().default('') }),
  publisher: contactSchema,
  /**
   * The publisher's logo: a PNG, JPEG or WebP file inside the scenario folder (path relative to
   * it), shown beside the publisher's name in every page header. Optional.
   */
  publisherLogo: z.string().min(1).max(300).optional(),
  authorities: z.array(contactSchema).min(1),
  seasons: z.array(seasonDefinitionSchema).default(defaultSeasons),
  /** Published seasons, oldest first; the last one is the season being published now. */
  publications: z.array(z.object({ season: z.string().regex(/^\d{4}-[a-z0-9-]+$/), date: isoDate })).min(1),
  corrections: z.array(z.object({ season: z.string(), segment: z.string().nullable().default(null), date: isoDate, reason: z.string().min(1) })).default([]),
  /**
   * Notes from the publisher, shown in a labelled box: on one segment's bulletin of a season, or
   * (segment null) on every bulletin and the overview of that season. A safe subset of Markdown:
   * links, emphasis and lists; anything else is shown as plain text.
   */
  notes: z
    .array(
      z.object({
        season: z.string().regex(/^\d{4}-[a-z0-9-]+$/, 'a season id such as 2026-autumn'),
        segment: slug.nullable().default(null),
        text: z.string().trim().min(1).max(2000, 'a short note: at most 2,000 characters'),
      }),
    )
    .default([]),
  trend: z
    .object({
      confidence: z.number().gt(0).lt(1).default(0.95),
      falseDiscoveryRate: z.number().gt(0).lt(1).default(0.05),
      bootstrapResamples: z.number().int().min(0).default(500),
      seed: z.number().int().default(1),
      minYears: z.number().int().min(2).default(5),
      minValues: z.number().int().min(3).default(8),
    })
    .default({}),
  drift: z
    .object({
      arrivalDistanceKm: z.number().positive().default(2),
      zoneDistanceKm: z.number().positive().default(4),
      zoneMinParticles: z.number().int().positive().default(25),
    })
    .default({}),
  riskRules: z.array(riskRuleSchema).default([]),
  /** First day of the monitored period; records dated earlier are left out. Optional. */
  monitoringStart: isoDate.optional(),
  /** Losses of table rows accepted on purpose (the loss guard, generator/read/loss-guard.ts). */
  leftOutAllowed: z.array(z.object({ table: z.string().min(1), share: z.number().min(0).max(1), reason: z.string().min(1) })).default([]),
});

export type ScenarioSettings = z.infer<typeof settingsSchema>;
export type RiskRule = z.infer<typeof riskRuleSchema>;
export type SeasonDefinition = z.infer<typeof seasonDefinitionSchema>;
