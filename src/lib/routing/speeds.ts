/**
 * Drive speeds by OpenStreetMap `highway` class, and the other knobs of the drive-time model. A practice
 * adjusts these (its lanes may be gravel, its county roads fast); every function that builds a graph
 * takes a partial override merged over the defaults.
 *
 * Defaults are common practice for rural United States driving, not measurements (see
 * docs/map-and-roads.md): interstate 65 mph, rural two-lane highways 45–50 mph, county and gravel roads
 * about 35 mph, farm lanes and drives 10–15 mph. Speeds are km/h because OpenStreetMap's maxspeed
 * default unit is km/h; 1 mph = 1.609344 km/h.
 */
export const DRIVABLE_CLASSES = [
  'motorway',
  'motorway_link',
  'trunk',
  'trunk_link',
  'primary',
  'primary_link',
  'secondary',
  'secondary_link',
  'tertiary',
  'tertiary_link',
  'unclassified',
  'residential',
  'living_street',
  'service',
  'track',
  'road',
] as const;

export type RoadClass = (typeof DRIVABLE_CLASSES)[number];

export interface RoutingSpeeds {
  /** Free-flow speed per highway class, km/h. */
  classKmh: Record<RoadClass, number>;
  /** Speed over the stretch between a place (barn, home) and its nearest road, km/h. */
  accessKmh: number;
  /** Speed used with the great-circle fallback for places far from every road, km/h. */
  fallbackKmh: number;
  /** Road distance ÷ straight-line distance assumed by the fallback. */
  circuity: number;
  /** A place farther than this from every road uses the fallback, metres. */
  maxSnapM: number;
  /**
   * Share of a posted `maxspeed` that traffic actually reaches; a road's speed is the slower of its class
   * speed and maxspeed × this factor. UK single carriageways with a 60 mph limit measure about 50 mph
   * free-flow (DfT 2019), hence 0.85.
   */
  maxspeedFactor: number;
}

const MPH = 1.609344;

/** The defaults every practice starts from. */
export const DEFAULT_SPEEDS: RoutingSpeeds = Object.freeze({
  classKmh: Object.freeze({
    motorway: Math.round(65 * MPH),
    motorway_link: Math.round(40 * MPH),
    trunk: Math.round(55 * MPH),
    trunk_link: Math.round(35 * MPH),
    primary: Math.round(50 * MPH),
    primary_link: Math.round(30 * MPH),
    secondary: Math.round(45 * MPH),
    secondary_link: Math.round(30 * MPH),
    tertiary: Math.round(35 * MPH),
    tertiary_link: Math.round(25 * MPH),
    unclassified: Math.round(30 * MPH),
    residential: Math.round(25 * MPH),
    living_street: Math.round(10 * MPH),
    service: Math.round(12 * MPH),
    track: Math.round(10 * MPH),
    road: Math.round(25 * MPH),
  }) as Record<RoadClass, number>,
  accessKmh: Math.round(10 * MPH),
  fallbackKmh: Math.round(30 * MPH),
  circuity: 1.3,
  maxSnapM: 1000,
  maxspeedFactor: 0.85,
}) as RoutingSpeeds;

/** A practice's partial adjustment; `classKmh` may name only the classes it changes. */
export type SpeedOverrides = Partial<Omit<RoutingSpeeds, 'classKmh'>> & { classKmh?: Partial<Record<RoadClass, number>> };

/** Merges overrides over the defaults and rejects values that would break the model. */
export function resolveSpeeds(overrides?: SpeedOverrides): RoutingSpeeds {
  const speeds: RoutingSpeeds = {
    ...DEFAULT_SPEEDS,
    ...overrides,
    classKmh: { ...DEFAULT_SPEEDS.classKmh, ...overrides?.classKmh } as Record<RoadClass, number>,
  };
  const positive: [string, number][] = [
    ...Object.entries(speeds.classKmh),
    ['accessKmh', speeds.accessKmh],
    ['fallbackKmh', speeds.fallbackKmh],
    ['maxSnapM', speeds.maxSnapM],
    ['maxspeedFactor', speeds.maxspeedFactor],
  ];
  for (const [key, value] of positive) {
    if (!Number.isFinite(value) || value <= 0) throw new RangeError(`speed setting ${key} must be a positive number, got ${value}`);
  }
  if (!(speeds.circuity >= 1)) throw new RangeError(`circuity must be at least 1, got ${speeds.circuity}`);
  return speeds;
}

/**
 * Parses an OpenStreetMap maxspeed value to km/h: "55 mph", "80", "80 km/h", "50 knots" (rare). Returns
 * null for symbolic values ("none", "signals", "RO:urban"), which then leave the class speed alone.
 */
export function parseMaxspeedKmh(value: unknown): number | null {
  if (typeof value === 'number') return value > 0 ? value : null;
  if (typeof value !== 'string') return null;
  const m = /^\s*(\d+(?:\.\d+)?)\s*(mph|km\/h|kmh|kph|knots)?\s*$/i.exec(value);
  if (!m) return null;
  const n = Number(m[1]);
  if (!(n > 0)) return null;
  const unit = (m[2] ?? 'km/h').toLowerCase();
  return unit === 'mph' ? n * MPH : unit === 'knots' ? n * 1.852 : n;
}
