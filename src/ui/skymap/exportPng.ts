import type { PlanResult } from '../../core/types';
import {
  colourBarOptions,
  colourBarTitle,
  drawColourBar,
  drawLegendSymbol,
  drawMapLayer,
  fitGeometry,
  frameNote,
  legendEntries,
  renderRaster,
  type SkyScale,
  type SkyView,
} from './figure';
import { fontPx, type Ctx2D } from './overlays';
import { coveredMasksAsync } from './coverageOutline';
import { LookupCache, type SkyFrame } from './skyProjection';

// The sky map as a PNG figure for a report: title, map, colour bar, legend and
// a caption stating the scenario. Drawn on its own canvas at the width asked
// for (the app passes max(1600, 2 x on-screen width)); needs no mounted SkyMap.

export interface SkyMapPngOptions {
  freqIndex: number;
  frame: SkyFrame;
  scale: SkyScale;
  flipLongitude: boolean;
  compare: boolean;
  /** Honoured exactly. */
  widthPx: number;
  title: string;
  caption: string;
  beamAt?: SkyView['beamAt'];
  diff?: SkyView['diff'];
  scheme?: SkyView['scheme'];
  /** 'noise' draws the radiometer noise map in K (default exposure); the title is the caller's */
  quantity?: SkyView['quantity'];
}

export const PNG_MIN_WIDTH = 400;
export const PNG_MAX_WIDTH = 8000;

const exportLookups = new LookupCache(2);

type AnyCanvas = HTMLCanvasElement | OffscreenCanvas;

function makeCanvas(w: number, h: number): AnyCanvas {
  if (typeof OffscreenCanvas !== 'undefined') return new OffscreenCanvas(w, h);
  const c = document.createElement('canvas');
  c.width = w;
  c.height = h;
  return c;
}

function ctxOf(c: AnyCanvas): Ctx2D {
  const ctx = c.getContext('2d') as Ctx2D | null;
  if (!ctx) throw new Error('PNG export: this browser gave no 2D canvas');
  return ctx;
}

async function toPng(c: AnyCanvas): Promise<Blob> {
  if ('convertToBlob' in c) return c.convertToBlob({ type: 'image/png' });
  return new Promise((resolve, reject) =>
    (c as HTMLCanvasElement).toBlob((b) => (b ? resolve(b) : reject(new Error('PNG export: the canvas produced no image'))), 'image/png'),
  );
}

/** Greedy word wrap to maxWidth with the context's current font. */
export function wrapText(ctx: { measureText(t: string): { width: number } }, text: string, maxWidth: number): string[] {
  const lines: string[] = [];
  for (const para of text.split('\n')) {
    let line = '';
    for (const word of para.split(/\s+/).filter(Boolean)) {
      const next = line ? `${line} ${word}` : word;
      if (line && ctx.measureText(next).width > maxWidth) {
        lines.push(line);
        line = word;
      } else line = next;
    }
    lines.push(line);
  }
  return lines;
}

export async function renderSkyMapPng(result: PlanResult, options: SkyMapPngOptions): Promise<Blob> {
  const W = Math.round(options.widthPx);
  if (!Number.isFinite(W) || W < PNG_MIN_WIDTH || W > PNG_MAX_WIDTH) {
    throw new RangeError(`PNG export: widthPx must be between ${PNG_MIN_WIDTH} and ${PNG_MAX_WIDTH}, got ${options.widthPx}`);
  }
  if (!result.maps[options.freqIndex]) {
    throw new RangeError(`PNG export: freqIndex must be 0 to ${result.maps.length - 1}, got ${options.freqIndex}`);
  }
  const view: SkyView = {
    freqIndex: options.freqIndex,
    frame: options.frame,
    scale: options.scale,
    flipLongitude: options.flipLongitude,
    compare: options.compare,
    diff: options.diff ?? null,
    beamAt: options.beamAt ?? null,
    scheme: options.scheme,
    quantity: options.quantity ?? 'exposure',
  };
  if (view.compare) await coveredMasksAsync(result);
  const u = W / 900; // text and line sizes relative to a 900 px figure
  const margin = Math.round(24 * u);
  const inner = W - 2 * margin;

  // Measure the text blocks first, so the canvas height fits them.
  const probe = ctxOf(makeCanvas(8, 8));
  probe.font = fontPx(18 * u, 'bold');
  const titleLines = wrapText(probe, options.title, inner);
  probe.font = fontPx(11.5 * u);
  const captionLines = wrapText(probe, options.caption, inner);
  const entries = legendEntries(result, view);
  // Left column: the overlays; right column: a heading, then one line per frequency.
  const left = entries.filter((e) => e.kind !== 'frequency');
  const right = entries.filter((e) => e.kind === 'frequency');
  const legendRows = Math.max(left.length, right.length + 1);
  const mapH = Math.round(W / 2);
  const titleH = titleLines.length * 24 * u + 6 * u;
  const noteH = 18 * u;
  const barH = view.compare ? 0 : 60 * u;
  const legendH = legendRows * 19 * u + 8 * u;
  const captionH = captionLines.length * 16 * u + 10 * u;
  const H = Math.round(margin + titleH + mapH + noteH + barH + legendH + captionH + margin);

  const canvas = makeCanvas(W, H);
  const ctx = ctxOf(canvas);
  ctx.fillStyle = '#ffffff';
  ctx.fillRect(0, 0, W, H);

  let y = margin;
  ctx.fillStyle = '#111';
  ctx.textAlign = 'left';
  ctx.textBaseline = 'top';
  ctx.font = fontPx(18 * u, 'bold');
  for (const line of titleLines) {
    ctx.fillText(line, margin, y);
    y += 24 * u;
  }
  y += 6 * u;

  // The map, rendered at full resolution (one raster pixel per output pixel).
  const g = fitGeometry(W, mapH, view.flipLongitude, u);
  const raster = renderRaster(result, view, (n) => exportLookups.get(g, view.frame, n, W, mapH), W, mapH);
  const rc = makeCanvas(W, mapH);
  const rctx = ctxOf(rc);
  rctx.putImageData(new ImageData(raster.pixels as unknown as Uint8ClampedArray<ArrayBuffer>, W, mapH), 0, 0);
  ctx.save();
  ctx.translate(0, y);
  drawMapLayer(ctx, g, rc, result, view, u);
  ctx.restore();
  y += mapH;

  ctx.font = fontPx(11.5 * u);
  ctx.fillStyle = '#333';
  ctx.textAlign = 'left';
  ctx.textBaseline = 'top';
  ctx.fillText(frameNote(view), margin, y + 2 * u);
  y += noteH;

  if (!view.compare && raster.scale && raster.lut) {
    drawColourBar(ctx, margin, y + 4 * u, Math.min(inner, 620 * u), raster.scale, raster.lut, colourBarTitle(view, raster.scale), u, colourBarOptions(result, view, raster.scale));
  } else if (raster.problem) {
    ctx.fillStyle = '#a00';
    ctx.fillText(raster.problem, margin, y + 4 * u);
  }
  y += barH;

  // Legend in two columns.
  const colW = inner / 2;
  const rowH = 19 * u;
  const line = (e: (typeof entries)[number], x: number, row: number, bold: boolean) => {
    const cy = y + row * rowH + 9 * u;
    drawLegendSymbol(ctx, e, x, cy, 26 * u, u);
    ctx.fillStyle = '#1a1a1a';
    ctx.textAlign = 'left';
    ctx.textBaseline = 'middle';
    ctx.font = fontPx(12 * u, bold ? 'bold' : '');
    ctx.fillText(e.kind === 'frequency' ? (e.short ?? e.label) : e.label, x + 34 * u, cy, colW - 40 * u);
  };
  left.forEach((e, i) => line(e, margin, i, false));
  ctx.font = fontPx(12 * u, 'bold');
  ctx.fillStyle = '#1a1a1a';
  ctx.textAlign = 'left';
  ctx.textBaseline = 'middle';
  ctx.fillText(
    view.compare
      ? 'Half-power outlines (within FWHM/2 of the usable track):'
      : view.diff ? `Usable hours, beam on the galactic band, plans ${view.diff.labelA} and ${view.diff.labelB}:` : 'Usable hours, beam on the galactic band (|b| < band + FWHM/2):',
    margin + colW,
    y + 9 * u,
    colW - 6 * u,
  );
  right.forEach((e, i) => line(e, margin + colW, i + 1, !view.compare && i === view.freqIndex));
  y += legendH;

  ctx.font = fontPx(11.5 * u);
  ctx.fillStyle = '#333';
  ctx.textBaseline = 'top';
  for (const line of captionLines) {
    ctx.fillText(line, margin, y);
    y += 16 * u;
  }
  return toPng(canvas);
}
