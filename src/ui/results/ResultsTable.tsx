import { useId } from 'react';
import type { PlanResult } from '../../core/types';
import { fixed, hours, percent, sig, wavelength, kelvin, kelvinMedianRange, steradian } from '../format';
import { ScrollCue } from '../ScrollCue';
import { summaryHours } from '../../core/export/summary';
import { skyLabel } from '../panel/skyLabels';

// One row per frequency, straight from PlanResult.summary (the same figures as summary.json).

/** A principal-plane width; 360 means the cut never falls to half power (a dipole with no ground plane). */
const widthText = (w: number) => (w >= 360 ? 'none' : `${sig(w, 3)}°`);

export function ResultsTable({ result, selected, onSelect }: { result: PlanResult; selected: number; onSelect: (i: number) => void }) {
  const s = result.summary;
  const capId = useId();
  // issue 13: usable time per frequency, beside what geometric shielding alone would give
  const diffraction = result.scenario.constraints.diffraction !== undefined;
  const perFreq = s.frequencies.some((f) => f.usable_hours !== undefined && f.usable_hours !== s.hours.usable);
  const notes = s.frequencies.map((f, i) => ({ f, i })).filter(({ f }) => f.usable_note);
  // issue 12: antenna temperature over usable time, and how much of the beam saw the ground
  const hasTAnt = s.frequencies.some((f) => f.t_ant_median_k !== undefined);
  const skyName = skyLabel(result.scenario.sky?.model ?? 'galaxy');
  const groundLeft = result.t_ant && !result.t_ant.ground_included
    ? s.frequencies.map((f, i) => ({ f, i })).filter(({ f }) => (f.t_ant_ground_fraction ?? 0) > 0)
    : [];
  return (
    <div>
      <p className="table-cap" id={capId}>
        Per-frequency coverage over {hours(s.hours.total)} h of span, {hours(s.hours.usable)} h usable{perFreq ? ' at one frequency at least' : ''}
      </p>
      <ScrollCue labelledBy={capId} testId="results-scroll">
      <table className="results" data-testid="results-table" aria-labelledby={capId}>
        <thead>
          <tr>
            <th scope="col" title="Frequency; below it the wavelength and the redshift z at which the 21-cm line arrives at this frequency">Frequency (wavelength, 21-cm z)</th>
            <th scope="col" title="Half-power widths of the main beam in its two principal planes, larger first (one value when they are equal)">FWHM</th>
            <th scope="col" title="Beam solid angle (integral of the free-space power pattern over the sphere) and directivity 10 log10(4π / solid angle)">Solid angle, directivity</th>
            <th scope="col" title={diffraction ? 'Usable hours at this frequency, with the hours the horizon mask would give as a perfect shield (no diffraction) beside them' : 'Usable hours at this frequency'}>
              Usable{diffraction ? ' (geometric shielding alone)' : ''}
            </th>
            <th scope="col">Sky covered</th>
            <th scope="col">Median exposure (covered)</th>
            <th scope="col">Max exposure</th>
            <th scope="col" title={`Usable hours with the beam within ${s.galactic.band_deg}° of the galactic plane`}>
              Beam on galactic band (|b| &lt; {s.galactic.band_deg}°)
            </th>
            <th scope="col" title={`Usable hours with the beam within ${s.galactic.center_radius_deg}° of the galactic centre`}>
              Beam near galactic centre (&lt; {s.galactic.center_radius_deg}°)
            </th>
            <th scope="col" title="Median over the covered sky of the radiometer noise σ_T (model stated under the table)">Noise</th>
            {hasTAnt && (
              <th scope="col" title={`Antenna temperature over usable time: the sky model's brightness averaged over the beam (${skyName})`}>
                Antenna temp.<br />median (range)
              </th>
            )}
          </tr>
        </thead>
        <tbody>
          {s.frequencies.map((f, i) => (
            <tr
              key={i}
              className={i === selected ? 'selected' : undefined}
              data-testid={`result-row-${i}`}
              data-mhz={f.mhz}
              data-sky-fraction={f.sky_fraction_covered}
              data-exposure-max={summaryHours(f.exposure_max_h)}
              data-noise-median={f.noise_median_k ?? ''}
              data-fwhm-major={f.beam?.fwhm_major_deg ?? ''}
              data-fwhm-minor={f.beam?.fwhm_minor_deg ?? ''}
              data-solid-angle={f.beam?.solid_angle_sr ?? ''}
              data-directivity={f.beam?.directivity_dbi ?? ''}
            >
              <th scope="row">
                <button type="button" className="linklike" onClick={() => onSelect(i)} aria-pressed={i === selected}
                  title="Show this frequency on the sky map">
                  {sig(f.mhz, 6)} MHz
                </button>
                <br /><span className="muted sub">{wavelength(f.wavelength_m)}, z = {fixed(f.redshift_21cm, 1)}</span>
              </th>
              <td data-testid={`beam-widths-${i}`}
                title={f.beam && f.beam.fwhm_major_deg !== f.beam.fwhm_minor_deg ? `geometric mean ${sig(f.fwhm_deg, 3)}°` : undefined}>
                {f.beam && sig(f.beam.fwhm_major_deg, 3) !== sig(f.beam.fwhm_minor_deg, 3)
                  ? `${widthText(f.beam.fwhm_major_deg)} × ${widthText(f.beam.fwhm_minor_deg)}`
                  : `${sig(f.fwhm_deg, 3)}°`}
              </td>
              <td>{f.beam ? <>{steradian(f.beam.solid_angle_sr, 3)}<br />{fixed(f.beam.directivity_dbi, 2)} dBi</> : '—'}</td>
              <td data-testid={`usable-cell-${i}`} data-usable={f.usable_hours ?? s.hours.usable} data-geometric={f.usable_hours_geometric ?? ''} className="nowrap">
                {hours(f.usable_hours ?? s.hours.usable)} h
                {diffraction && f.usable_hours_geometric !== undefined && <span className="muted"> ({hours(f.usable_hours_geometric)} h)</span>}
                {f.usable_note && <sup><a href={`#${capId}-note-${i}`} aria-label="why this frequency loses time" title={f.usable_note}>†</a></sup>}
              </td>
              <td>{percent(f.sky_fraction_covered)}</td>
              <td>{hours(f.exposure_median_h_covered)} h</td>
              <td>{hours(f.exposure_max_h)} h</td>
              <td>{hours(f.usable_hours_beam_in_band)} h</td>
              <td>{hours(f.usable_hours_beam_near_center)} h</td>
              <td data-testid={`noise-cell-${i}`}>{f.noise_median_k !== undefined && Number.isFinite(f.noise_median_k) ? kelvin(f.noise_median_k, 4) : '—'}</td>
              {hasTAnt && (
                <td data-testid={`tant-cell-${i}`} data-median={f.t_ant_median_k ?? ''} data-min={f.t_ant_min_k ?? ''} data-max={f.t_ant_max_k ?? ''}>
                  {f.t_ant_median_k !== undefined && Number.isFinite(f.t_ant_median_k)
                    ? (() => { const k = kelvinMedianRange(f.t_ant_median_k, f.t_ant_min_k!, f.t_ant_max_k!); return <>{k.median}<br /><span className="muted sub">({k.range})</span></>; })()
                    : '—'}
                </td>
              )}
            </tr>
          ))}
        </tbody>
      </table>
      </ScrollCue>
      {notes.length > 0 && (
        <ul className="table-note usable-notes" data-testid="usable-notes">
          {notes.map(({ f, i }) => <li key={i} id={`${capId}-note-${i}`}>† {sig(f.mhz, 6)} MHz: {f.usable_note}.</li>)}
        </ul>
      )}
      {hasTAnt && (
        <p className="table-note" data-testid="tant-note">
          Antenna temperature: the sky model, {skyName}, averaged over the beam as it drifts, over usable time.
          {result.t_ant?.ground_included && result.scenario.sky?.ground_temp_k !== undefined &&
            ` The beam's share below the horizon or the mask sees the ground at ${kelvin(result.scenario.sky.ground_temp_k, 4)}.`}
          {groundLeft.length > 0 && (
            <span data-testid="ground-left">
              {' '}Left out (no ground temperature set), as a share of the beam:{' '}
              {groundLeft.map(({ f }) => `${sig(f.mhz, 6)} MHz ${percent(f.t_ant_ground_fraction!)}`).join(', ')}; set a ground temperature in the Sky section to count it.
            </span>
          )}
        </p>
      )}
      {diffraction && (
        <p className="table-note">
          Usable hours count the Sun{s.hours.earth_down !== null ? ' and the Earth' : ''} behind the rim as shielded only while the knife-edge loss over the
          rim (ITU-R P.526, single knife edge, rim {result.scenario.constraints.diffraction!.rim_distance_m === null ? 'distance per mask point' : `${result.scenario.constraints.diffraction!.rim_distance_m} m away`})
          reaches {result.scenario.constraints.diffraction!.min_attenuation_db} dB; in brackets, the mask as a perfect shield. Diffraction around
          the body's limb is not modelled.
        </p>
      )}
      <p className="table-note">
        Zenith declination {fixed(s.zenith.dec_min_deg, 2)}° to {fixed(s.zenith.dec_max_deg, 2)}°; ecliptic latitude{' '}
        {fixed(s.zenith.ecl_lat_min_deg, 2)}° to {fixed(s.zenith.ecl_lat_max_deg, 2)}°. Sun down {hours(s.hours.sun_down)} h
        {s.hours.earth_down !== null ? `, Earth down ${hours(s.hours.earth_down)} h` : ''}; zenith itself in the galactic band{' '}
        {hours(s.galactic.usable_hours_zenith_in_band)} h and near the centre {hours(s.galactic.usable_hours_zenith_near_center)} h
        (usable). Step {sig(s.step_min, 3)} min, {s.samples.toLocaleString('en-US')} samples.
      </p>
    </div>
  );
}
