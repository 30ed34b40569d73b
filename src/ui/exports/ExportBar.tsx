import { useState } from 'react';
import type { PlanResult } from '../../core/types';
import { antennaTempCsv, coverageCsv, targetsCsv, trackCsv } from '../../core/export/csv';
import { depthAreaCsv } from '../../core/sky/depthArea';
import { skyLabel } from '../panel/skyLabels';
import { coverageFits } from '../../core/export/fits';
import { summaryJson } from '../../core/export/summary';
import { renderSkyMapPng } from '../skymap/exportPng';
import type { SkyFrame, SkyScale } from '../skymap/SkyMap';
import { diffCaption, scenarioCaption } from '../caption';
import { noiseCaption } from '../sensitivity/NoiseNote';
import { downloadBlob, downloadText, fileStem } from './download';

// One button per file; each builds its file from the result on screen.

export interface ViewState {
  freqIndex: number; frame: SkyFrame; scale: SkyScale; flipLongitude: boolean; compare: boolean;
  beamAt?: { ra_deg: number; dec_deg: number; usable: boolean } | null;
  diff?: { other: PlanResult; labelA: string; labelB: string } | null;
  /** 'noise': the figure shows the radiometer noise map (K) instead of exposure */
  quantity?: 'exposure' | 'noise' | 'sky';
}

/** `pngBase`: the plan the figure is drawn from (plan A in difference mode, else `result`). */
export function ExportBar({ result, pngBase, view, mapWidth }: { result: PlanResult; pngBase?: PlanResult; view: ViewState; mapWidth: number }) {
  const [busy, setBusy] = useState<string | null>(null);
  const [msg, setMsg] = useState<string | null>(null);
  const stem = fileStem(result.scenario.name);
  const f = result.scenario.telescope.frequencies_mhz[view.freqIndex];

  const act = (what: string, fn: () => Promise<void> | void) => async () => {
    setBusy(what);
    setMsg(null);
    try {
      await fn();
    } catch (e) {
      setMsg(`${what} failed: ${e instanceof Error ? e.message : String(e)}`);
    } finally {
      setBusy(null);
    }
  };

  const buttons: { label: string; desc: string; run: () => Promise<void> | void }[] = [
    {
      label: 'Download PNG',
      desc: `sky map figure at ${f} MHz with colour bar, legend and caption`,
      run: async () => {
        const widthPx = Math.max(1600, Math.round(2 * mapWidth));
        const what = view.diff
          ? `exposure difference B − A at ${f} MHz`
          : view.compare ? `half-power outlines at ${result.scenario.telescope.frequencies_mhz.join(', ')} MHz` : view.quantity === 'noise' ? `radiometer noise (K) at ${f} MHz` : view.quantity === 'sky' ? `sky brightness temperature (K) at ${f} MHz, ${skyLabel(result.scenario.sky?.model ?? 'galaxy')} sky model` : `exposure at ${f} MHz`;
        const base = pngBase ?? result;
        const title = view.diff
          ? `${base.scenario.name || 'untitled'} (A) and ${result.scenario.name || 'untitled'} (B) — ${what}`
          : `${result.scenario.name || 'Swathe scenario'} — ${what}`;
        const caption = view.diff
          ? diffCaption(base.scenario, result.scenario, view.freqIndex, view.diff.labelA, view.diff.labelB)
          : scenarioCaption(result.scenario, view.freqIndex, { outlines: view.compare });
        const fullCaption = view.quantity === 'noise' && !view.diff && !view.compare ? `${noiseCaption(result, view.freqIndex)} ${caption}` : caption;
        const blob = await renderSkyMapPng(base, { ...view, widthPx, title, caption: fullCaption });
        downloadBlob(blob, `${stem}-${view.diff ? 'diff-' : ''}${view.compare ? 'compare' : `${f}mhz${view.quantity === 'noise' && !view.diff ? '-noise' : view.quantity === 'sky' && !view.diff ? '-sky' : ''}`}-${view.frame}.png`);
      },
    },
    { label: 'Download CSV', desc: 'coverage.csv: exposure per HEALPix pixel, every frequency', run: () => downloadText(coverageCsv(result), `${stem}-coverage.csv`, 'text/csv') },
    { label: 'Download track CSV', desc: 'track.csv: zenith, Sun and Earth per sample', run: () => downloadText(trackCsv(result), `${stem}-track.csv`, 'text/csv') },
    ...(result.t_ant
      ? [{ label: 'Download antenna temperature CSV', desc: 'antenna_temp.csv: antenna temperature per sample, every frequency', run: () => downloadText(antennaTempCsv(result), `${stem}-antenna_temp.csv`, 'text/csv') }]
      : []),
    ...(result.noise_maps
      ? [{ label: 'Download depth-area CSV', desc: 'depth_area.csv: sky area at or below each noise level, every frequency', run: () => downloadText(depthAreaCsv(result), `${stem}-depth_area.csv`, 'text/csv') }]
      : []),
    ...(result.summary.targets
      ? [{ label: 'Download targets CSV', desc: 'targets.csv: per target and frequency, hours in the half-power beam, exposure, mean antenna temperature and noise', run: () => downloadText(targetsCsv(result), `${stem}-targets.csv`, 'text/csv') }]
      : []),
    {
      label: 'Download FITS',
      desc: 'coverage.fits: HEALPix binary table, one column per frequency',
      run: () => {
        const bytes = coverageFits(result);
        downloadBlob(new Blob([bytes as BlobPart], { type: 'application/fits' }), `${stem}-coverage.fits`);
      },
    },
    { label: 'Download summary JSON', desc: 'summary.json: the figures in the table', run: () => downloadText(summaryJson(result.summary), `${stem}-summary.json`, 'application/json') },
  ];

  return (
    <section className="exports" aria-label="Downloads">
      {buttons.map((b) => (
        <button key={b.label} type="button" onClick={act(b.label, b.run)} disabled={busy !== null} title={b.desc}>
          {busy === b.label ? `${b.label}…` : b.label}
        </button>
      ))}
      {msg && <span className="error" role="alert">{msg}</span>}
    </section>
  );
}
