// Shared shapes passed between the pipeline stages (see ARCHITECTURE.md §1).
// Stages are pure: each takes the previous stage's output and returns new
// typed arrays; nothing here touches the DOM or global state.

export type BodyName = 'moon' | 'earth' | 'mars';
export type BeamModel = 'gaussian' | 'airy';

/** A validated, normalised `swathe.scenario/1` (defaults filled in). */
export interface Scenario {
  format: 'swathe.scenario/1';
  name: string;
  site: { body: BodyName; lat_deg: number; lon_deg: number };
  span: { start: string; end: string; step_min: number | null };
  telescope: {
    aperture_m: number;
    frequencies_mhz: number[];
    beam: { model: BeamModel; fwhm_factor: number };
  };
  constraints: {
    sun_max_elev_deg: number | null;
    earth_max_elev_deg: number | null;
    /** [[azimuth_deg, elevation_deg], ...], azimuth from north through east. */
    horizon_mask: [number, number][] | null;
  };
  map: { nside: number; galactic_band_deg: number; galactic_center_radius_deg: number };
}

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
