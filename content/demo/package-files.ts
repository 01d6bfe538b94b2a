/**
 * The two JSON entry files of a scenario folder: datapackage.json (a Frictionless Data Package
 * listing every file with its Table Schema) and scenario.json (the settings, checked against
 * generator/scenario/settings.ts).
 */

const detection = { detectionLimitPrefix: '<' };
const segmentKey = [{ fields: ['segment_id'], reference: { resource: 'segments', fields: ['id'] } }];
const csvDialect = { delimiter: ',', header: true };
const INVENTED = 'Invented data for demonstration only: the coast, places, agencies and every value are made up by a seeded script.';

function tableResource(name: string, indicator: string, title: string, description: string, fields: object[], primaryKey: string): object {
  return {
    name,
    role: 'indicator',
    indicator,
    title,
    description: `${description} ${INVENTED}`,
    path: `tables/${name}.csv`,
    profile: 'tabular-data-resource',
    format: 'csv',
    mediatype: 'text/csv',
    encoding: 'utf-8',
    dialect: csvDialect,
    schema: { fields, missingValues: [''], primaryKey: [primaryKey], foreignKeys: segmentKey },
  };
}

const idField = (name: string, description: string) => ({ name, type: 'string', description, constraints: { required: true, unique: true } });
const segmentField = { name: 'segment_id', type: 'string', description: 'Coastline segment (id in segments.geojson).', constraints: { required: true } };
const dateField = { name: 'date', type: 'date', format: 'default', description: 'Day of the survey or sample (ISO 8601).', constraints: { required: true } };

export interface PackageOptions {
  name: string;
  title: string;
  description: string;
  /** Fixed creation stamp (never the clock). */
  created: string;
  drift: 'positions-and-trajectories' | 'positions';
  /** list the invented land polygons (land.geojson) as the maps' land resource */
  land?: boolean;
}

export function makeDatapackage(options: PackageOptions): object {
  const resources: object[] = [
    {
      name: 'settings',
      role: 'settings',
      title: 'Scenario settings',
      description: `Region, contacts, published seasons, trend and risk settings. ${INVENTED}`,
      path: 'scenario.json',
      format: 'json',
      mediatype: 'application/json',
    },
    {
      name: 'segments',
      role: 'segments',
      title: 'Coastline segments',
      description: `Coastline segments as GeoJSON LineStrings (WGS84 longitude/latitude) with id, name, kind, shellfish use and place. ${INVENTED}`,
      path: 'segments.geojson',
      format: 'geojson',
      mediatype: 'application/geo+json',
    },
    ...(options.land
      ? [
          {
            name: 'land',
            role: 'land',
            title: 'Land',
            description: `Land polygons (mainland and island) drawn under the segments on the maps, GeoJSON (WGS84 longitude/latitude). ${INVENTED}`,
            path: 'land.geojson',
            format: 'geojson',
            mediatype: 'application/geo+json',
          },
        ]
      : []),
    tableResource(
      'beach-litter',
      'beach-litter',
      'Beach-litter surveys',
      'Items larger than 2.5 cm counted along a surveyed stretch of shore; normalised to items per 100 m.',
      [
        idField('survey_id', 'Survey identifier.'),
        segmentField,
        dateField,
        { name: 'surveyed_length_m', type: 'number', unit: 'm', description: 'Length of shore surveyed.', constraints: { required: true, exclusiveMinimum: 0 } },
        { name: 'items', type: 'integer', unit: 'items', description: 'All items larger than 2.5 cm.', constraints: { required: true, minimum: 0 } },
        { name: 'plastic_items', type: 'integer', unit: 'items', description: 'Plastic items among them (optional).', constraints: { minimum: 0 } },
        { name: 'area_m2', type: 'number', unit: 'm2', description: 'Surveyed area, where recorded (for the Clean Coast Index).', constraints: { exclusiveMinimum: 0 } },
      ],
      'survey_id',
    ),
    tableResource(
      'water-microplastics',
      'water-microplastics',
      'Microplastics in surface water',
      'Net-tow samples of surface water; particles per cubic metre; "<x" means below the detection limit x.',
      [
        idField('sample_id', 'Sample identifier.'),
        segmentField,
        dateField,
        {
          name: 'particles_per_m3',
          type: 'number',
          unit: 'particles/m3',
          ...detection,
          description: 'Particles per cubic metre of water filtered.',
          constraints: { required: true, minimum: 0 },
        },
        { name: 'mesh_um', type: 'number', unit: 'um', description: 'Net mesh size.', constraints: { required: true, exclusiveMinimum: 0 } },
      ],
      'sample_id',
    ),
    tableResource(
      'shellfish-tissue',
      'shellfish-tissue',
      'Microplastics in shellfish tissue',
      'Particles per gram of wet tissue; "<x" means below the detection limit x.',
      [
        idField('sample_id', 'Sample identifier.'),
        segmentField,
        dateField,
        { name: 'species', type: 'string', description: 'Shellfish species sampled (common name).', constraints: { required: true } },
        {
          name: 'particles_per_g_ww',
          type: 'number',
          unit: 'particles/g ww',
          ...detection,
          description: 'Particles per gram wet weight.',
          constraints: { required: true, minimum: 0 },
        },
      ],
      'sample_id',
    ),
    tableResource(
      'wildlife-reports',
      'wildlife-reports',
      'Wildlife entanglement and ingestion reports',
      'One row per report; the seasonal series is the number of animals reported per season (none reported counts 0).',
      [
        idField('report_id', 'Report identifier.'),
        segmentField,
        dateField,
        { name: 'kind', type: 'string', description: 'What was reported.', constraints: { required: true, enum: ['entanglement', 'ingestion'] } },
        { name: 'animals', type: 'integer', unit: 'animals', description: 'Animals in the report.', constraints: { required: true, minimum: 1 } },
      ],
      'report_id',
    ),
    {
      name: 'drift-positions',
      role: 'drift-positions',
      title: 'Modelled particle positions',
      description: `Daily positions of particles from an invented toy drift model (gyres, a coastal current, windage); "ashore" marks the last position of a particle that reached the shore. ${INVENTED}`,
      path: 'drift/positions.csv.gz',
      profile: 'tabular-data-resource',
      format: 'csv',
      mediatype: 'text/csv',
      compression: 'gz',
      encoding: 'utf-8',
      dialect: csvDialect,
      schema: {
        fields: [
          { name: 'particle', type: 'integer', description: 'Particle number.', constraints: { required: true, minimum: 0 } },
          { name: 'time', type: 'datetime', description: 'Time of the position (ISO 8601, UTC).', constraints: { required: true } },
          { name: 'lon', type: 'number', unit: 'degrees_east', constraints: { required: true, minimum: -180, maximum: 180 } },
          { name: 'lat', type: 'number', unit: 'degrees_north', constraints: { required: true, minimum: -90, maximum: 90 } },
          { name: 'status', type: 'string', constraints: { enum: ['drifting', 'ashore'] } },
        ],
        missingValues: [''],
        primaryKey: ['particle', 'time'],
      },
    },
  ];
  if (options.drift === 'positions-and-trajectories') {
    resources.push({
      name: 'drift-trajectories',
      role: 'drift-trajectories',
      title: 'Modelled trajectories (CF NetCDF)',
      description: `A subset of the same toy drift run (the latest season) as a CF-1.8 trajectory file, contiguous ragged array layout. ${INVENTED}`,
      path: 'drift/trajectories.nc',
      format: 'netcdf',
      mediatype: 'application/x-netcdf',
    });
  }
  return {
    profile: 'data-package',
    name: options.name,
    title: options.title,
    description: `${options.description} ${INVENTED}`,
    created: options.created,
    licenses: [{ name: 'CC0-1.0', title: 'Creative Commons Zero v1.0 Universal' }],
    keywords: ['invented', 'demonstration', 'coastal litter', 'microplastics'],
    resources,
  };
}

/** Risk rules of the demo. The highest matching rule sets the level. */
export const DEMO_RISK_RULES = [
  {
    id: 'litter-at-threshold',
    level: 'noticeable',
    indicator: 'beach-litter',
    measure: 'assessment-median',
    op: '>=',
    value: 20,
    text: 'The median beach litter over the last four seasons, {value} items per 100 m, is at or above {threshold}, the threshold value used in the European Union (a yardstick, not a legal limit).',
    source: 'Van Loon et al. 2020, JRC: EU threshold value for macro litter on coastlines (median vs 20 items/100 m)',
  },
  {
    id: 'litter-high',
    level: 'marked',
    indicator: 'beach-litter',
    measure: 'assessment-median',
    op: '>=',
    value: 100,
    text: 'The median beach litter over the last four seasons, {value} items per 100 m, is at or above {threshold}, five times that threshold value.',
    source: 'Demo setting: five times the threshold value of Van Loon et al. 2020',
  },
  {
    id: 'litter-above-baseline',
    level: 'heavy',
    indicator: 'beach-litter',
    measure: 'assessment-median',
    op: '>=',
    value: 233,
    text: 'The median beach litter over the last four seasons, {value} items per 100 m, is at or above {threshold}, the average found on north-east Atlantic beaches in 2015 and 2016.',
    source: 'Van Loon et al. 2020, JRC: baseline mean, north-east Atlantic',
  },
  {
    id: 'clean-coast-moderate',
    level: 'noticeable',
    indicator: 'beach-litter',
    measure: 'clean-coast-index',
    op: '>',
    value: 5,
    text: 'The Clean Coast Index, {value}, is above {threshold}: the beach is no longer "clean" on that scale.',
    source: 'Alkalay, Pasternak & Zask 2007, Ocean Coast. Manage. 50:352–362 (classes)',
  },
  {
    id: 'clean-coast-dirty',
    level: 'marked',
    indicator: 'beach-litter',
    measure: 'clean-coast-index',
    op: '>',
    value: 10,
    text: 'The Clean Coast Index, {value}, is above {threshold}: the beach counts as "dirty" on that scale.',
    source: 'Alkalay, Pasternak & Zask 2007, Ocean Coast. Manage. 50:352–362 (classes)',
  },
  {
    id: 'clean-coast-extreme',
    level: 'heavy',
    indicator: 'beach-litter',
    measure: 'clean-coast-index',
    op: '>',
    value: 20,
    text: 'The Clean Coast Index, {value}, is above {threshold}: the beach counts as "extremely dirty" on that scale.',
    source: 'Alkalay, Pasternak & Zask 2007, Ocean Coast. Manage. 50:352–362 (classes)',
  },
  {
    id: 'drift-arrivals-upper-quarter',
    level: 'noticeable',
    indicator: 'drift-arrivals',
    measure: 'region-percentile',
    op: '>=',
    value: 75,
    text: 'In the drift model, more modelled particles per km reached this place than {value}% of places on this coast (this level starts at {threshold}%). It shows where floating litter tends to go, not how much there is.',
    source: 'Demo setting',
  },
  {
    id: 'drift-arrivals-top-tenth',
    level: 'marked',
    indicator: 'drift-arrivals',
    measure: 'region-percentile',
    op: '>=',
    value: 90,
    text: 'In the drift model, more modelled particles per km reached this place than {value}% of places on this coast (this level starts at {threshold}%). It shows where floating litter tends to go, not how much there is.',
    source: 'Demo setting',
  },
  {
    id: 'shellfish-above-typical',
    level: 'noticeable',
    indicator: 'shellfish-tissue',
    measure: 'assessment-median',
    op: '>=',
    value: 1,
    text: 'The median level in shellfish over the last four seasons, {value} particles per gram, is at or above {threshold}, more than most published studies find. This is not a safety limit: none exists.',
    source: 'Danopoulos et al. 2020, Environ. Health Perspect. 128(12):126002 (most studies below 1 particle/g)',
  },
  {
    id: 'litter-rise-very-likely',
    level: 'noticeable',
    indicator: 'beach-litter',
    measure: 'probability-up',
    op: '>',
    value: 0.9,
    text: 'Beach litter is going up, and the chance of a rise is {value}.',
    source: 'Hirsch, Archfield & De Cicco 2015, Environ. Model. Softw. (likelihood of an upward trend)',
  },
  {
    id: 'water-rise-very-likely',
    level: 'noticeable',
    indicator: 'water-microplastics',
    measure: 'probability-up',
    op: '>',
    value: 0.9,
    text: 'Plastic in the sea water is going up, and the chance of a rise is {value}.',
    source: 'Hirsch, Archfield & De Cicco 2015, Environ. Model. Softw. (likelihood of an upward trend)',
  },
];

export interface SettingsOptions {
  regionId: string;
  regionName: string;
  regionDescription: string;
  orgName: string;
  seed: number;
  /** First day of the monitored period (ISO date). */
  monitoringStart: string;
}

export function makeSettings(options: SettingsOptions): object {
  const org = options.orgName;
  return {
    invented: true,
    region: { id: options.regionId, name: options.regionName, description: options.regionDescription },
    publisher: {
      role: 'publisher',
      name: `${org} Coastal Observatory`,
      email: 'bulletins@observatory.example.org',
      url: 'https://observatory.example.org/',
      phone: '+00 555 0100',
    },
    authorities: [
      {
        role: 'shellfish-sanitation',
        name: `${org} Shellfish Sanitation Board`,
        phone: '+00 555 0142',
        email: 'harvest-areas@shellfish.example.org',
        url: 'https://shellfish.example.org/harvest-areas',
      },
      { role: 'public-health', name: `${org} Regional Public Health Office`, phone: '+00 555 0177', email: 'enquiries@health.example.org', url: 'https://health.example.org/' },
      { role: 'debris-report', name: `${org} Shore Debris Line`, phone: '+00 555 0123', email: 'report@shore-debris.example.org', url: 'https://shore-debris.example.org/report' },
      { role: 'wildlife-rescue', name: `${org} Marine Animal Rescue`, phone: '+00 555 0199', email: 'rescue@animal-rescue.example.org' },
    ],
    publications: [
      { season: '2026-summer', date: '2026-09-01' },
      { season: '2026-autumn', date: '2026-12-01' },
    ],
    corrections: [],
    monitoringStart: options.monitoringStart,
    trend: { confidence: 0.95, falseDiscoveryRate: 0.05, bootstrapResamples: 500, seed: options.seed, minYears: 5, minValues: 8 },
    drift: { arrivalDistanceKm: 2, zoneDistanceKm: 4, zoneMinParticles: 25 },
    riskRules: DEMO_RISK_RULES,
  };
}
