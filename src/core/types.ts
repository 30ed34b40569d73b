// Shared shapes passed between the pipeline stages (see ARCHITECTURE.md §1).
// Stages are pure: each takes the previous stage's output and returns new
// typed arrays; nothing here touches the DOM or global state.

export type BodyName = 'moon' | 'earth' | 'mars';
export type BeamModel = 'gaussian' | 'airy' | 'elliptical_gaussian' | 'dipole' | 'pattern';

/** A measured or simulated power pattern (antenna frame): gain_db[f][zenith][azimuth]. */
export interface PatternTable {
  zenith_deg: number[];
  azimuth_deg: number[];
  frequencies_mhz: number[];
  gain_db: number[][][];
}

/**
 * `telescope.beam` (ARCHITECTURE.md section 6). `fwhm_factor` is always present
 * (default 1.15); the other fields belong to their model and are present only for it.
 */
export interface BeamSpec {
  model: BeamModel;
  fwhm_factor: number;
  /** elliptical_gaussian: aperture length and width (m); dipole: tip-to-tip length (m) */
  length_m?: number;
  width_m?: number;
  /** dipole: height over a perfectly conducting ground (m); null = no ground plane */
  height_m?: number | null;
  /** elliptical_gaussian (default 0), dipole (default 90): the long side / the wire, degrees in the antenna frame */
  axis_azimuth_deg?: number;
  /** pattern */
  table?: PatternTable;
}

/** Boresight of the antenna frame's z axis in the local horizon frame. */
export interface Pointing { elevation_deg: number; azimuth_deg: number }

/** An extra beam of a multi-beam feed: tangent-plane offsets from the main boresight along the antenna frame's x and y. */
export interface FeedOffset { x_offset_deg: number; y_offset_deg: number }

/** One time segment of a pointing plan (segments tile the span). */
export interface PlanSegment { start: string; end: string; elevation_deg: number; azimuth_deg: number }

/** `sky` (ARCHITECTURE.md section 6): which sky brightness the antenna sees. */
export type SkyModelName = 'galaxy' | 'uniform' | 'map';
export interface SkyMapRef {
  /** path relative to the scenario file (CLI); in the app, the name of the file the user picked */
  file: string;
  frequency_mhz: number;
}
export interface SkySpec {
  model: SkyModelName;
  /** model `map` only: one or more HEALPix FITS maps at distinct frequencies */
  maps?: SkyMapRef[];
  /** model `map` with one map: brightness-temperature spectral index beta */
  spectral_index?: number;
  /** temperature of the ground seen by the part of the beam below the horizon or mask, K; absent = left out */
  ground_temp_k?: number;
}

/**
 * A named sky position (`targets[]`): J2000/ICRS right ascension and
 * declination, or galactic longitude and latitude; exactly one pair is present.
 */
export type Target =
  | { name: string; ra_deg: number; dec_deg: number }
  | { name: string; l_deg: number; b_deg: number };

/** A validated, normalised `swathe.scenario/1` (defaults filled in). */
export interface Scenario {
  format: 'swathe.scenario/1';
  name: string;
  site: { body: BodyName; lat_deg: number; lon_deg: number };
  span: { start: string; end: string; step_min: number | null };
  telescope: {
    /** required for the gaussian and airy models; absent for the others */
    aperture_m?: number;
    frequencies_mhz: number[];
    beam: BeamSpec;
    /** optional: fixed boresight (default zenith); kept only when given */
    pointing?: Pointing;
    /** optional: extra beams of a multi-beam feed */
    feeds?: FeedOffset[];
    /** optional: boresight per time segment (overrides pointing) */
    pointing_plan?: PlanSegment[];
    /** optional (added): channel bandwidth for the noise maps, MHz; default in stats.ts SENSITIVITY_DEFAULTS */
    bandwidth_mhz?: number;
    /** optional (added): receiver noise temperature, K */
    receiver_temp_k?: number;
  };
  constraints: {
    sun_max_elev_deg: number | null;
    earth_max_elev_deg: number | null;
    /** [[azimuth_deg, elevation_deg(, rim_distance_m)], ...], azimuth from north through east. */
    horizon_mask: HorizonPoint[] | null;
    /** added, optional: shielding by diffraction over the rim (ARCHITECTURE.md §6); kept only when given */
    diffraction?: { rim_distance_m: number | null; min_attenuation_db: number };
    /** added, optional: the ionosphere's critical frequency, MHz, with the Sun above / below the horizon (Earth and Mars sites) */
    ionosphere?: { day_mhz: number; night_mhz: number };
    /** added, optional: the Sun's centre at least this far from every boresight, degrees */
    sun_min_separation_deg?: number;
  };
  map: { nside: number; galactic_band_deg: number; galactic_center_radius_deg: number };
  /** added, optional: the sky brightness model; absent means the default (`galaxy`); kept only when given */
  sky?: SkySpec;
  /** added, optional: named sky positions to report on (targets.csv, summary.targets); kept only when given */
  targets?: Target[];
}

/** A horizon-mask point: azimuth and elevation (degrees), optionally the distance to that point of the rim (metres). */
export type HorizonPoint = [number, number] | [number, number, number];

/** One problem found in an input; `field` is a dotted path such as `site.lat_deg`. */
export interface FieldIssue {
  field: string;
  message: string; // full sentence naming the field, the allowed range and the value got
}

/**
 * The ephemeris stage output: one entry per sample in [start, end).
 * Sample i is at t0_ms + i * step_min minutes and stands for the interval
 * [t_i, min(t_i + step, end)); `weight_h[i]` is that interval's length in hours.
 */
export interface Track {
  body: BodyName;
  t0_ms: number; // UTC milliseconds since 1970 of sample 0
  end_ms: number;
  step_min: number;
  n: number;
  weight_h: Float64Array;
  /** Zenith unit vector, J2000 equatorial (ICRS axes). */
  zx: Float64Array;
  zy: Float64Array;
  zz: Float64Array;
  ra_deg: Float64Array;
  dec_deg: Float64Array;
  l_deg: Float64Array;
  b_deg: Float64Array;
  ecl_lat_deg: Float64Array;
  /** Topocentric elevation/azimuth of the body centres at the site (azimuth from north through east). */
  sun_elev_deg: Float64Array;
  sun_az_deg: Float64Array;
  /** null for a site on the Earth. */
  earth_elev_deg: Float64Array | null;
  earth_az_deg: Float64Array | null;
}

/**
 * A stage is a generator that yields its progress (fraction 0..1) now and then
 * (at least every ~50k items of work) and returns its result. The engine runner
 * drives it, yields to the event loop between chunks, reports progress and
 * cancels by simply not resuming it; `drain` runs one synchronously.
 */
export type Stage<T> = Generator<number, T, void>;

export function drain<T>(stage: Stage<T>): T {
  for (;;) {
    const r = stage.next();
    if (r.done) return r.value;
  }
}

/** Per-frequency figures of `swathe.summary/1` (ARCHITECTURE.md §3). */
export interface FrequencySummary {
  mhz: number;
  wavelength_m: number;
  redshift_21cm: number;
  fwhm_deg: number;
  sky_fraction_covered: number;
  exposure_max_h: number;
  exposure_median_h_covered: number;
  /** usable hours with |b(zenith)| < band_deg + FWHM/2 */
  usable_hours_beam_in_band: number;
  /** added field: usable hours with the zenith within center_radius_deg + FWHM/2 of l=0,b=0 */
  usable_hours_beam_near_center: number;
  /** added: sky temperature of the stated sky model at this frequency, K */
  t_sky_k?: number;
  /** added: T_sky + T_receiver, K */
  t_sys_k?: number;
  /** added: median over covered pixels of the radiometer-equation noise, K; NaN (null in JSON) when no pixel is covered */
  noise_median_k?: number;
  /** hours usable at this frequency (ARCHITECTURE.md §6); equal for every frequency when nothing depends on frequency */
  usable_hours?: number;
  /** added: what usable_hours would be with the horizon mask as a perfect shield (no diffraction) */
  usable_hours_geometric?: number;
  /** added: why this frequency loses time to a plasma cut-off, in words; absent when it does not */
  usable_note?: string;
  /** antenna temperature over the samples usable at this frequency (median, least, largest), K */
  t_ant_median_k?: number;
  t_ant_min_k?: number;
  t_ant_max_k?: number;
  /** share of the beam below the horizon or mask (largest over pointing segments): seen as ground_temp_k, or left out of T_ant */
  t_ant_ground_fraction?: number;
  /** figures of the free-space beam (main feed): principal-plane FWHMs, solid angle, directivity */
  beam?: { fwhm_major_deg: number; fwhm_minor_deg: number; solid_angle_sr: number; directivity_dbi: number };
}

/** Figures of one pointing-plan segment. */
export interface SegmentSummary {
  index: number;
  start: string;
  end: string;
  elevation_deg: number;
  azimuth_deg: number;
  usable_hours: number;
  frequencies: { mhz: number; sky_fraction_covered: number; exposure_max_h: number }[];
}

/** added: the sensitivity inputs and model a run used (the radiometer equation). */
export interface SensitivitySummary {
  bandwidth_mhz: number;
  receiver_temp_k: number;
  sky_model: string;
  note: string;
  /** added: how T_sys enters the noise maps */
  estimator?: string;
}

export interface HoursSummary { total: number; sun_down: number; earth_down: number | null; usable: number }
export interface ZenithSummary { dec_min_deg: number; dec_max_deg: number; ecl_lat_min_deg: number; ecl_lat_max_deg: number }
export interface GalacticSummary {
  band_deg: number;
  center_radius_deg: number;
  usable_hours_zenith_in_band: number;
  usable_hours_zenith_near_center: number;
}

/** Figures of one target at one frequency (summary.targets[].frequencies[], targets.csv). */
export interface TargetFrequencyFigures {
  mhz: number;
  usable_hours_in_beam: number;
  exposure_h: number;
  /** NaN (null in JSON) when the target is never in the half-power beam */
  t_ant_mean_k: number;
  /** NaN (null in JSON) when the exposure is 0 */
  noise_k: number;
}

/** One target of summary.targets: both coordinate pairs and the figures per frequency. */
export interface TargetSummary {
  name: string;
  ra_deg: number;
  dec_deg: number;
  l_deg: number;
  b_deg: number;
  frequencies: TargetFrequencyFigures[];
}

export interface Summary {
  format: 'swathe.summary/1';
  scenario: Scenario;
  step_min: number;
  samples: number;
  hours: HoursSummary;
  zenith: ZenithSummary;
  galactic: GalacticSummary;
  frequencies: FrequencySummary[];
  /** added */
  sensitivity?: SensitivitySummary;
  /** per pointing-plan segment (only with a plan) */
  segments?: SegmentSummary[];
  /** added: per target of scenario.targets (only when targets are given) */
  targets?: TargetSummary[];
}

/** Everything a plan run produces; the UI and the exports read only this. */
export interface PlanResult {
  scenario: Scenario;
  track: Track;
  /** 1 where the sample is usable under the scenario's constraints (at one frequency at least). */
  usable: Uint8Array;
  /** Exposure in hours per HEALPix RING pixel at scenario.map.nside, one map per frequency (same order). */
  maps: Float32Array[];
  summary: Summary;
  /** added: radiometer noise in kelvin per RING pixel, one map per frequency; NaN where the exposure is 0 */
  noise_maps?: Float32Array[];
  /** added: 1 where the pixel centre came within FWHM/2 of the usable path (the sky_fraction_covered mask), per frequency */
  covered?: Uint8Array[];
  /** added: antenna temperature per sample (K), one series per frequency (ARCHITECTURE.md section 6) */
  t_ant?: { series: Float32Array[]; ground_fraction: number[]; ground_included: boolean };
  /** added: the sky model's brightness (K) at each frequency, a RING map in its own coordinates (for the app's sky-temperature view) */
  sky_k?: { nside: number; coordsys: 'G' | 'C' | 'E'; values: Float32Array }[];
  /** added: usable flags per frequency (identical ones are the same array); `usable` is their union */
  usable_by_freq?: Uint8Array[];
}
