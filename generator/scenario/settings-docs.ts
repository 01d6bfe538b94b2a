/**
 * What every setting of scenario.json means, with an example: the text of the published JSON
 * Schema (schema/scenario.schema.json, written by schema/write-settings-schema.ts) and of the
 * commented settings file `wrackline init` writes. Keys are paths into the settings; `[]` stands
 * for every item of a list. A test checks that every property of the schema has an entry here.
 */

export interface SettingDoc {
  description: string;
  example: unknown;
}

const contact = (prefix: string, example: { role: string; name: string }): { [path: string]: SettingDoc } => ({
  [`${prefix}.role`]: {
    description:
      'What this contact is for: shellfish-sanitation (harvest areas), public-health, debris-report (where to report debris), publisher (who publishes the bulletins) or wildlife-rescue.',
    example: example.role,
  },
  [`${prefix}.name`]: { description: 'Name of the office or organisation, as readers should look it up.', example: example.name },
  [`${prefix}.phone`]: { description: 'Telephone number shown on every bulletin (optional).', example: '+00 555 0142' },
  [`${prefix}.email`]: { description: 'E-mail address shown on every bulletin (optional).', example: 'office@example.org' },
  [`${prefix}.url`]: { description: 'Web address shown on every bulletin (optional).', example: 'https://example.org/' },
});

export const settingsDocs: { readonly [path: string]: SettingDoc } = {
  $schema: { description: 'Where an editor finds this JSON Schema, to check and complete the file while you type (optional).', example: '../schema/scenario.schema.json' },
  invented: {
    description: 'true when the data is made up (a demonstration or a test): every page then carries a banner saying the data is invented. Leave false for real monitoring data.',
    example: false,
  },
  region: { description: 'The stretch of coast the bulletins cover.', example: { id: 'north-coast', name: 'North Coast' } },
  'region.id': { description: 'Short id of the region: lower-case letters, digits and hyphens. Used in file names.', example: 'north-coast' },
  'region.name': { description: 'Name of the region as readers know it.', example: 'North Coast' },
  'region.description': {
    description: 'One or two sentences about the region, shown on the overview page (optional).',
    example: 'Sandy beaches and two shellfish-farming bays between the river mouth and the cape.',
  },
  publisher: { description: 'Who publishes the bulletins; shown on every page.', example: { role: 'publisher', name: 'Coastal Monitoring Office' } },
  ...contact('publisher', { role: 'publisher', name: 'Coastal Monitoring Office' }),
  publisherLogo: {
    description:
      "The publisher's logo, shown beside the publisher's name in every page header (optional). A file inside the scenario folder, path relative to it: a PNG, JPEG or WebP image (told by its first bytes, not its name), at most 256 KB and 2,000 pixels a side. SVG is refused, as an SVG drawing can carry script: give a PNG instead. The built site serves it under a name made from its SHA-256.",
    example: 'brand/logo.png',
  },
  authorities: {
    description:
      'The authorities a reader is sent to (at least one). A bulletin never opens or closes a shellfish harvest area: it defers to the shellfish-sanitation and public-health authorities listed here.',
    example: [{ role: 'shellfish-sanitation', name: 'Shellfish Sanitation Office', phone: '+00 555 0142' }],
  },
  ...contact('authorities[]', { role: 'shellfish-sanitation', name: 'Shellfish Sanitation Office' }),
  seasons: {
    description:
      'The seasons of a year, each a list of months; together they should cover all twelve months (a record in no season is left out). Default: four meteorological seasons. A season whose months run past December takes the year of its last month: winter 2026 is December 2025 to February 2026.',
    example: [{ id: 'winter', label: 'Winter', months: [12, 1, 2] }],
  },
  'seasons[].id': { description: 'Short id of the season, used in season ids such as 2026-winter.', example: 'winter' },
  'seasons[].label': { description: 'Name of the season shown to readers.', example: 'Winter' },
  'seasons[].months': { description: 'Months of the season, 1 = January, in calendar order from its first month.', example: [12, 1, 2] },
  publications: {
    description:
      'The seasons published so far, oldest first, each with its publication date; the last one is the season being published now. Records dated after the last publication date are left out. A past season keeps its published words unless a correction is recorded.',
    example: [{ season: '2026-summer', date: '2026-09-01' }],
  },
  'publications[].season': { description: 'Season id: the year, a hyphen and a season id from "seasons" (the year of the season\'s last month).', example: '2026-summer' },
  'publications[].date': { description: "Date the season's bulletins are published (YYYY-MM-DD), after the season ends.", example: '2026-09-01' },
  corrections: {
    description:
      'Changes to bulletins of a season already published, each with its reason; the page then shows the correction. Without one, a build that would change a past season stops. Default: none.',
    example: [{ season: '2026-summer', segment: 'north-beach', date: '2026-10-02', reason: 'A survey was entered twice.' }],
  },
  'corrections[].season': { description: 'Season id of the corrected bulletins.', example: '2026-summer' },
  'corrections[].segment': { description: 'Segment id of the corrected bulletin, or null for every segment of the season.', example: 'north-beach' },
  'corrections[].date': { description: 'Date of the correction (YYYY-MM-DD).', example: '2026-10-02' },
  'corrections[].reason': { description: 'Why the bulletin changed, in plain words; shown on the page.', example: 'A survey was entered twice.' },
  trend: { description: 'Settings of the trend statistics. The defaults suit most monitoring programmes.', example: { confidence: 0.95, minYears: 5 } },
  'trend.confidence': { description: "Confidence level of the interval around Sen's slope (between 0 and 1). Default 0.95.", example: 0.95 },
  'trend.falseDiscoveryRate': { description: 'False discovery rate across all segments (Benjamini–Hochberg), between 0 and 1. Default 0.05.', example: 0.05 },
  'trend.bootstrapResamples': { description: 'Number of bootstrap resamples for the uncertainty band of a chart; 0 draws no band. Default 500.', example: 500 },
  'trend.seed': { description: 'Seed of the random numbers of the bootstrap, so a build gives the same band every time. Default 1.', example: 1 },
  'trend.minYears': { description: 'Fewest years of data before a trend is stated. Default 5.', example: 5 },
  'trend.minValues': { description: 'Fewest season values before a trend is stated. Default 8.', example: 8 },
  drift: { description: 'Settings for drift-model output; used only when datapackage.json lists drift files.', example: { arrivalDistanceKm: 2 } },
  'drift.arrivalDistanceKm': { description: 'A modelled particle within this distance (km) of a segment counts as arriving there. Default 2.', example: 2 },
  'drift.zoneDistanceKm': { description: 'Neighbourhood distance (km) when grouping offshore particles into accumulation zones (DBSCAN). Default 4.', example: 4 },
  'drift.zoneMinParticles': { description: 'Fewest particles that form an accumulation zone (DBSCAN). Default 25.', example: 25 },
  riskRules: {
    description:
      "The rule table that sets each segment's level; the highest level among the matching rules wins. When none are given (the default), the built-in rules apply (generator/risk/default-rules.ts, listed on the methods page); built-in rules about an indicator with no data are not used.",
    example: [
      {
        id: 'litter-at-threshold',
        level: 'noticeable',
        indicator: 'beach-litter',
        measure: 'assessment-median',
        op: '>=',
        value: 20,
        text: 'Beach litter has a median of {value} items per 100 m, at or above {threshold}.',
      },
    ],
  },
  'riskRules[].id': { description: 'Short id of the rule, shown on the methods page.', example: 'litter-at-threshold' },
  'riskRules[].level': { description: 'The level the rule sets when it matches: scant, noticeable, marked or heavy.', example: 'noticeable' },
  'riskRules[].indicator': { description: 'The indicator the rule looks at. A rule about an indicator with no data is reported by `wrackline check`.', example: 'beach-litter' },
  'riskRules[].measure': {
    description:
      "What is compared: assessment-median (median of the last four seasons), clean-coast-index, region-percentile (rank among the region's segments) or probability-up (likelihood of a rise).",
    example: 'assessment-median',
  },
  'riskRules[].op': { description: 'How the measure is compared with the value: >=, >, <= or <.', example: '>=' },
  'riskRules[].value': { description: "The threshold compared with the measure, in the indicator's unit.", example: 20 },
  'riskRules[].text': {
    description: 'Plain words shown under "why this level"; {value} and {threshold} are filled in.',
    example: 'Beach litter has a median of {value} items per 100 m, at or above {threshold}.',
  },
  'riskRules[].source': { description: 'Where the threshold comes from (optional), shown on the methods page.', example: 'Van Loon et al. 2020, JRC' },
  monitoringStart: {
    description: 'First day of the monitored period (YYYY-MM-DD); records dated earlier are left out. Optional: without it, every date counts.',
    example: '2018-01-01',
  },
  dataNotice: {
    description:
      "Which notice every page carries: 'demo' (an invented coast with invented figures), 'test-data' (real places, made-up figures), 'provisional' (real figures not yet checked) or 'none'. Left out, invented: true gives 'demo' and invented: false gives 'none'.",
    example: 'provisional',
  },
  notes: {
    description:
      "Notes from the publisher, each shown in its own labelled box: on one segment's bulletin of a season, or, with segment null, on every bulletin and the overview of that season. Written in a safe subset of Markdown (links, emphasis, lists); anything else is shown as plain text. A note on a past season is a change to a published bulletin and needs a correction.",
    example: [{ season: '2026-winter', segment: null, text: 'A storm in January moved a lot of litter onto these beaches.' }],
  },
  'notes[].season': { description: 'The season the note belongs to, as in publications.', example: '2026-winter' },
  'notes[].segment': { description: "The segment id whose bulletin shows the note, or null for every bulletin and the season's overview.", example: 'orrin-bay' },
  'notes[].text': {
    description: 'The note, at most 2,000 characters of safe Markdown (links, emphasis, lists).',
    example: 'A storm in January moved a lot of litter onto *these* beaches.',
  },
  leftOutAllowed: {
    description:
      "Losses of table rows accepted on purpose. By default a check or build stops when more than 5 % of a table's rows are left out, or every row of a segment in a table; an entry here names the table and the share of rows that may be left out (and so also accepts segments losing every row of it).",
    example: [{ table: 'tables/beach-litter.csv', share: 0.2, reason: 'Surveys before 2019 used another protocol and are left out.' }],
  },
  'leftOutAllowed[].table': { description: 'Path of the table as listed in datapackage.json.', example: 'tables/beach-litter.csv' },
  'leftOutAllowed[].share': { description: "Share of the table's rows that may be left out, from 0 to 1 (0.2 = 20 %).", example: 0.2 },
  'leftOutAllowed[].reason': { description: 'Why the loss is accepted, in plain words.', example: 'Surveys before 2019 used another protocol and are left out.' },
};
