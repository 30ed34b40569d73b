import { z } from 'zod';
import { SCENARIO_FORMAT, SCENARIO_LIMITS as L } from './scenario';

// The published shape of a swathe.scenario/1 file, as a JSON Schema for
// editors and other programs (public/swathe.scenario.schema.json, written by
// scripts/write-scenario-schema.ts). Validation with its precise messages
// stays in scenario.ts; this schema takes every range from the same
// SCENARIO_LIMITS, and tests/unit/scenario-schema.test.ts checks that the two
// agree field by field, so neither can drift. Rules that span several fields
// (span end after start, beam width at the lowest frequency, plan segments
// tiling the span, plasma cut-off) are only in scenario.ts.

const inRange = (r: readonly [number, number], what: string) => z.number().min(r[0]).max(r[1]).describe(what);
const utc = z.string().regex(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}(:\d{2}(\.\d{1,9})?)?Z$/).describe('UTC time, ISO 8601 with Z');
const elev = (what: string) => z.union([inRange(L.elev_deg, what), z.null()]);

const horizonPoint = z.union([
  z.tuple([inRange(L.horizon_az_deg, 'azimuth, degrees from north through east'), inRange(L.horizon_el_deg, 'skyline elevation, degrees')]),
  z.tuple([inRange(L.horizon_az_deg, 'azimuth, degrees from north through east'), inRange(L.horizon_el_deg, 'skyline elevation, degrees'),
    z.number().gt(L.rim_distance_m[0]).max(L.rim_distance_m[1]).describe('distance to this point of the rim, metres')]),
]);

const pointing = z.strictObject({
  elevation_deg: z.number().gt(L.pointing_elevation_deg[0]).max(L.pointing_elevation_deg[1]).optional().describe('boresight elevation, degrees (default 90)'),
  azimuth_deg: inRange(L.pointing_azimuth_deg, 'boresight azimuth, degrees from north through east (default 0)').optional(),
});

const fwhmFactor = inRange(L.fwhm_factor, 'FWHM = k lambda / size; default 1.15').optional();
const beamSize = (what: string) => inRange(L.beam_size_m, what);
const axisAz = (what: string) => inRange(L.axis_azimuth_deg, what).optional();

const patternTable = z.strictObject({
  zenith_deg: z.array(inRange(L.table_zenith_deg, 'zenith angle, degrees')).min(2).max(1801).describe('increasing, from 0 to at least 90'),
  azimuth_deg: z.array(z.number().min(0).lt(360)).min(1).max(3600).describe('increasing, from 0, below 360'),
  frequencies_mhz: z.array(inRange(L.frequency_mhz, 'MHz')).min(1).max(16).describe('increasing'),
  gain_db: z.array(z.array(z.array(inRange(L.table_gain_db, 'gain, dB (any normalisation)')))).describe('[frequency][zenith][azimuth]'),
});

const beam = z.discriminatedUnion('model', [
  z.strictObject({ model: z.enum(['gaussian', 'airy']), fwhm_factor: fwhmFactor }),
  z.strictObject({
    model: z.literal('elliptical_gaussian'), fwhm_factor: fwhmFactor,
    length_m: beamSize('aperture length, metres'), width_m: beamSize('aperture width, metres (at most the length)'),
    axis_azimuth_deg: axisAz('azimuth of the long side in the antenna frame (default 0)'),
  }),
  z.strictObject({
    model: z.literal('dipole'), fwhm_factor: fwhmFactor,
    length_m: beamSize('tip-to-tip length, metres'),
    height_m: z.union([z.number().gt(L.dipole_height_m[0]).max(L.dipole_height_m[1]), z.null()]).optional().describe('height over a perfect ground, metres; null: no ground plane'),
    axis_azimuth_deg: axisAz('azimuth of the wire in the antenna frame (default 90)'),
  }),
  z.strictObject({ model: z.literal('pattern'), fwhm_factor: fwhmFactor, table: patternTable }),
]);

const frequency = inRange(L.frequency_mhz, 'MHz');

const targetName = z.string().min(1).max(L.target_name_max_chars).describe('a name of its own (distinct among the targets)');
const lonLike = (what: string) => z.number().min(L.target_lon_deg[0]).lt(L.target_lon_deg[1]).describe(what);
const target = z.union([
  z.strictObject({ name: targetName, ra_deg: lonLike('right ascension, J2000/ICRS, degrees'), dec_deg: inRange(L.target_lat_deg, 'declination, J2000/ICRS, degrees') }),
  z.strictObject({ name: targetName, l_deg: lonLike('galactic longitude, degrees'), b_deg: inRange(L.target_lat_deg, 'galactic latitude, degrees') }),
]);

/** The scenario file as written (before defaults are filled in). */
export const scenarioFileSchema = z.strictObject({
  $schema: z.string().optional().describe('where this schema lives (ignored by Swathe)'),
  format: z.literal(SCENARIO_FORMAT),
  name: z.string().max(L.name_max_chars).optional(),
  site: z.strictObject({
    body: z.enum(['moon', 'earth', 'mars']),
    lat_deg: inRange(L.lat_deg, 'site latitude, degrees (planetocentric on Mars)'),
    lon_deg: z.number().describe('site longitude, degrees east (any value; normalised to [-180, 180))'),
  }),
  span: z.strictObject({
    start: utc, end: utc,
    step_min: z.union([inRange(L.step_min, 'minutes'), z.null()]).optional().describe('sample step; null or absent: automatic'),
  }),
  telescope: z.strictObject({
    aperture_m: inRange(L.aperture_m, 'dish diameter, metres (required for the gaussian and airy beams)').optional(),
    frequencies_mhz: z.array(frequency).min(L.frequencies_count[0]).max(L.frequencies_count[1]).describe('distinct frequencies'),
    beam: beam.optional(),
    bandwidth_mhz: inRange(L.bandwidth_mhz, 'channel bandwidth, MHz').optional(),
    receiver_temp_k: inRange(L.receiver_temp_k, 'receiver noise temperature, K').optional(),
    pointing: pointing.optional(),
    feeds: z.array(z.strictObject({
      x_offset_deg: inRange(L.feed_offset_deg, 'offset along the antenna x axis, degrees'),
      y_offset_deg: inRange(L.feed_offset_deg, 'offset along the antenna y axis, degrees'),
    })).min(L.feeds_count[0]).max(L.feeds_count[1]).optional(),
    pointing_plan: z.array(z.strictObject({
      start: utc, end: utc,
      elevation_deg: z.number().gt(L.pointing_elevation_deg[0]).max(L.pointing_elevation_deg[1]).optional(),
      azimuth_deg: inRange(L.pointing_azimuth_deg, 'degrees').optional(),
    })).min(L.plan_segments[0]).max(L.plan_segments[1]).optional().describe('segments that tile the span, each with its boresight'),
  }),
  constraints: z.strictObject({
    sun_max_elev_deg: elev('the Sun counts as up above this elevation, degrees; null: no constraint').optional(),
    earth_max_elev_deg: elev('the Earth counts as up above this elevation, degrees; null: no constraint (must be null on the Earth)').optional(),
    horizon_mask: z.union([z.array(horizonPoint).min(L.horizon_points[0]).max(L.horizon_points[1]), z.null()]).optional(),
    diffraction: z.strictObject({
      rim_distance_m: z.union([z.number().gt(L.rim_distance_m[0]).max(L.rim_distance_m[1]), z.null()]).optional(),
      min_attenuation_db: inRange(L.min_attenuation_db, 'dB of knife-edge loss that counts as shielded'),
    }).optional(),
    ionosphere: z.strictObject({
      day_mhz: inRange(L.critical_mhz, 'critical frequency with the Sun up, MHz'),
      night_mhz: inRange(L.critical_mhz, 'critical frequency with the Sun down, MHz'),
    }).optional(),
    sun_min_separation_deg: inRange(L.sun_min_separation_deg, 'least angle from the Sun to every boresight, degrees').optional(),
  }).optional(),
  map: z.strictObject({
    nside: z.number().int().min(L.nside[0]).max(L.nside[1]).describe('HEALPix nside, a power of two').optional(),
    galactic_band_deg: inRange(L.galactic_band_deg, 'half-width of the galactic band, degrees').optional(),
    galactic_center_radius_deg: inRange(L.galactic_center_radius_deg, 'radius around the galactic centre, degrees').optional(),
  }).optional(),
  sky: z.strictObject({
    model: z.enum(['galaxy', 'uniform', 'map']).optional(),
    maps: z.array(z.strictObject({
      file: z.string().min(1).max(L.sky_map_file_max_chars).describe('HEALPix FITS map, path relative to the scenario file'),
      frequency_mhz: frequency,
    })).min(L.sky_maps_count[0]).max(L.sky_maps_count[1]).optional(),
    spectral_index: inRange(L.spectral_index, 'brightness-temperature index beta (one map only)').optional(),
    ground_temp_k: inRange(L.ground_temp_k, 'temperature of the ground the beam sees below the horizon, K').optional(),
  }).optional(),
  targets: z.array(target).min(L.targets_count[0]).max(L.targets_count[1]).optional()
    .describe('named sky positions reported in targets.csv and summary.json: RA/Dec (J2000) or galactic l/b'),
});

/** The JSON Schema (draft 2020-12) published beside the app. */
export function scenarioJsonSchema(): Record<string, unknown> {
  const js = z.toJSONSchema(scenarioFileSchema, { io: 'input', target: 'draft-2020-12' }) as Record<string, unknown>;
  return {
    $schema: js.$schema,
    $id: 'swathe.scenario.schema.json',
    title: `Swathe scenario (${SCENARIO_FORMAT})`,
    description: 'A Swathe planning scenario. Ranges as in README "Scenario file"; rules that span several fields are checked by Swathe itself.',
    ...Object.fromEntries(Object.entries(js).filter(([k]) => k !== '$schema')),
  };
}
