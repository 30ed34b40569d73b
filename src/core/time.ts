import type { BodyName, Scenario } from './types';
import { fwhmRad } from './beam';
import { narrowestWidthRad } from './antenna/models';

// Sidereal rotation periods in days (rate at which a site's zenith sweeps the sky).
// Moon: sidereal month 27.321661 d (IAU/ARCHITECTURE §4); Earth: 0.99726968 d
// sidereal day; Mars: 1.02595676 d (IAU WGCCRE 2015, 350.891982443297 deg/day).
export const SIDEREAL_PERIOD_D: Record<BodyName, number> = {
  moon: 27.321661,
  earth: 0.99726968,
  mars: 360 / 350.891982443297,
};

export const MAX_STEP_MIN = 60;

/** Strict UTC ISO-8601 parse ("2031-01-01T00:00:00Z", optional fraction); null if not valid. */
export function parseUtcMs(s: string): number | null {
  const m = /^(\d{4})-(\d{2})-(\d{2})T(\d{2}):(\d{2})(?::(\d{2})(\.\d{1,9})?)?Z$/.exec(s);
  if (!m) return null;
  const [y, mo, d, h, mi, se] = [1, 2, 3, 4, 5, 6].map((i) => Number(m[i] ?? 0));
  if (mo < 1 || mo > 12 || d < 1 || d > 31 || h > 23 || mi > 59 || se > 59) return null;
  // setUTCFullYear, not Date.UTC: Date.UTC reads years 0..99 as 1900..1999.
  const date = new Date(0);
  date.setUTCFullYear(y, mo - 1, d);
  date.setUTCHours(h, mi, se, 0);
  const ms = date.getTime() + (m[7] ? Math.round(Number(m[7]) * 1000) : 0);
  const back = new Date(ms);
  if (back.getUTCDate() !== d || back.getUTCMonth() !== mo - 1 || back.getUTCFullYear() !== y) return null; // e.g. 31 April
  return ms;
}

/**
 * Automatic step: the zenith moves at most FWHM_min/8 between samples, and a
 * step is never longer than 60 minutes. The zenith's angular speed on the sky
 * is the body's sidereal rate times cos(latitude).
 */
export function autoStepMin(s: Scenario): number {
  const b = s.telescope.beam;
  const fwhmMin = (b.model === 'gaussian' || b.model === 'airy') && s.telescope.aperture_m !== undefined
    ? Math.min(...s.telescope.frequencies_mhz.map((f) => fwhmRad(f, s.telescope.aperture_m!, b)))
    : narrowestWidthRad(s.telescope.frequencies_mhz, b, s.telescope.aperture_m);
  const rateRadPerMin = (2 * Math.PI) / (SIDEREAL_PERIOD_D[s.site.body] * 1440);
  // a tilted or offset beam may sweep faster than the zenith: take the largest speed (the equator's)
  const t = s.telescope;
  const tilted = (t.pointing !== undefined && t.pointing.elevation_deg !== 90) || !!t.feeds?.length || !!t.pointing_plan?.length;
  const speed = rateRadPerMin * (tilted ? 1 : Math.cos((s.site.lat_deg * Math.PI) / 180));
  const step = speed > 0 ? fwhmMin / 8 / speed : MAX_STEP_MIN;
  return Math.min(MAX_STEP_MIN, step);
}

export function stepMin(s: Scenario): number {
  return s.span.step_min ?? autoStepMin(s);
}

/** Number of samples in [start, end) at the scenario's step. */
export function sampleCount(s: Scenario): number {
  const t0 = parseUtcMs(s.span.start)!;
  const t1 = parseUtcMs(s.span.end)!;
  return Math.ceil((t1 - t0) / (stepMin(s) * 60_000));
}
