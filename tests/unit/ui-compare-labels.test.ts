import { describe, expect, it } from 'vitest';
import { lab, rgb } from 'd3-color';
import type { PlanResult } from '../../src/core/types';
import { DEMO_SCENARIO } from '../../src/core/demo';
import { OUTLINE_COLOURS, OUTLINE_COLOUR_NAMES, outlineColour, outlineColourName } from '../../src/ui/skymap/coverageOutline';
import { OVERLAY_STYLE } from '../../src/ui/skymap/overlays';
import { ZERO_RGBA } from '../../src/ui/skymap/colour';
import { legendEntries, type SkyView } from '../../src/ui/skymap/figure';
import { diffCaption, diffHeadline, scenarioCaption } from '../../src/ui/caption';

// Issue 9 items 2 and 6: a difference map names both plans' figures, each
// marked A or B; comparison outlines use colours no overlay uses, distinct
// under simulated colour-vision deficiencies, and every outline is named.

/** A plan with given per-frequency "beam on the band" hours (only what the legend reads). */
function plan(name: string, lat: number, inBand: number[], freqs = [8, 16]): PlanResult {
  const scenario = {
    ...DEMO_SCENARIO,
    name,
    site: { ...DEMO_SCENARIO.site, lat_deg: lat },
    telescope: { ...DEMO_SCENARIO.telescope, frequencies_mhz: freqs },
  };
  const frequencies = freqs.map((f, i) => ({ frequency_mhz: f, usable_hours_beam_in_band: inBand[i], sky_fraction_covered: 0.1 * (i + 1) }));
  return { scenario, maps: freqs.map(() => new Float32Array(12)), summary: { frequencies } } as unknown as PlanResult;
}

const VIEW: SkyView = { freqIndex: 0, frame: 'equatorial', scale: 'linear', flipLongitude: false, compare: false };

describe('difference map labels (item 2)', () => {
  const a = plan('Plan north', 10, [2081, 900]);
  const b = plan('Plan south', -20, [2275, 1000]);
  const view: SkyView = { ...VIEW, diff: { other: b, labelA: 'A', labelB: 'B' } };

  it('the legend gives both plans\' hours, each after its letter', () => {
    const rows = legendEntries(a, view).filter((e) => e.kind === 'frequency');
    expect(rows.map((e) => e.short)).toEqual(['8 MHz: A 2,081 h, B 2,275 h', '16 MHz: A 900 h, B 1,000 h']);
    expect(rows[0].label).toContain('A 2,081 h, B 2,275 h');
  });

  it('without a difference the legend keeps one figure per frequency', () => {
    const rows = legendEntries(a, VIEW).filter((e) => e.kind === 'frequency');
    expect(rows.map((e) => e.short)).toEqual(['8 MHz: 2,081 h', '16 MHz: 900 h']);
  });

  it('the caption names plan A and plan B with their sites', () => {
    const head = diffHeadline(a.scenario, b.scenario);
    expect(head).toMatch(/B minus plan A/);
    expect(head).toContain('A (pinned): Plan north (Moon 10.00° N');
    expect(head).toContain('B (current): Plan south (Moon 20.00° S');
    const cap = diffCaption(a.scenario, b.scenario, 0);
    const paras = cap.split('\n');
    expect(paras).toHaveLength(4);
    expect(paras[1]).toMatch(/^A: Site: Moon 10\.00° N/);
    expect(paras[2]).toMatch(/^B: Site: Moon 20\.00° S/);
    expect(cap.match(/Planning estimates/g)).toHaveLength(1);
  });
});

// Colour difference: CIE 1976 ΔE*ab in CIELAB (D65), computed with d3-color's Lab conversion
// (an outside implementation of CIE 15; the app colours outlines without it).
const dE = (x: string, y: string) => {
  const p = lab(x), q = lab(y);
  return Math.hypot(p.l - q.l, p.a - q.a, p.b - q.b);
};

// Simulated dichromacy, severity 1.0, on linear RGB: the matrices of Machado, Oliveira & Fernandes,
// "A physiologically-based model for simulation of color vision deficiency", IEEE TVCG 15 (2009),
// table for severity 1.0 (values from memory of the published table).
const MACHADO: Record<string, number[][]> = {
  protanopia: [[0.152286, 1.052583, -0.204868], [0.114503, 0.786281, 0.099216], [-0.003882, -0.048116, 1.051998]],
  deuteranopia: [[0.367322, 0.860646, -0.227968], [0.280085, 0.672501, 0.047413], [-0.01182, 0.04294, 0.968881]],
  tritanopia: [[1.255528, -0.076749, -0.178779], [-0.078411, 0.930809, 0.147602], [0.004733, 0.691367, 0.3039]],
};
// sRGB transfer function, IEC 61966-2-1.
const toLin = (c: number) => (c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4);
const toEnc = (c: number) => { const v = Math.min(1, Math.max(0, c)); return v <= 0.0031308 ? 12.92 * v : 1.055 * v ** (1 / 2.4) - 0.055; };
function simulate(hex: string, m: number[][]): string {
  const c = rgb(hex);
  const v = [c.r, c.g, c.b].map((x) => toLin(x / 255));
  const o = m.map((r) => toEnc(r[0] * v[0] + r[1] * v[1] + r[2] * v[2]) * 255);
  return rgb(o[0], o[1], o[2]).formatHex();
}

/** Every colour the overlays draw, as opaque sRGB (rgba() taken at full opacity), and the grey of unobserved sky. */
function overlayColours(): string[] {
  const out = Object.values(OVERLAY_STYLE).map((c) => rgb(c.replace(/rgba\(([^)]*),\s*[\d.]+\)/, 'rgb($1)')).formatHex());
  out.push(rgb(ZERO_RGBA[0], ZERO_RGBA[1], ZERO_RGBA[2]).formatHex());
  return out;
}

describe('comparison outline colours (item 6)', () => {
  it('no outline colour is near any overlay colour (ΔE*ab ≥ 25)', () => {
    // 25 is well past "clearly different at a glance" (ΔE about 10 is already obvious side by side; common practice).
    const ov = overlayColours();
    expect(ov.length).toBeGreaterThanOrEqual(10);
    for (const c of OUTLINE_COLOURS) for (const o of ov) expect(dE(c, o), `${c} vs overlay ${o}`).toBeGreaterThanOrEqual(25);
  });

  it('outlines stay apart from each other with normal vision and simulated protanopia, deuteranopia, tritanopia', () => {
    for (const [kind, m] of [['normal', null], ...Object.entries(MACHADO)] as [string, number[][] | null][]) {
      for (let i = 0; i < OUTLINE_COLOURS.length; i++) {
        for (let j = i + 1; j < OUTLINE_COLOURS.length; j++) {
          const x = m ? simulate(OUTLINE_COLOURS[i], m) : OUTLINE_COLOURS[i];
          const y = m ? simulate(OUTLINE_COLOURS[j], m) : OUTLINE_COLOURS[j];
          expect(dE(x, y), `${kind}: ${OUTLINE_COLOUR_NAMES[i]} vs ${OUTLINE_COLOUR_NAMES[j]}`).toBeGreaterThanOrEqual(15);
        }
      }
    }
  });

  it('the simulation is a real one: red and green collapse under deuteranopia', () => {
    // Guards the check above against a simulation that changes nothing.
    expect(dE('#d62728', '#2ca02c')).toBeGreaterThan(60);
    expect(dE(simulate('#d62728', MACHADO.deuteranopia), simulate('#2ca02c', MACHADO.deuteranopia))).toBeLessThan(dE('#d62728', '#2ca02c') / 2);
  });

  it('every outline is named in the legend and in the PNG caption', () => {
    const freqs = [5, 8, 12, 16, 20, 25, 30, 40, 50];
    const r = plan('Many', 0, freqs.map(() => 10), freqs);
    const rows = legendEntries(r, { ...VIEW, compare: true }).filter((e) => e.kind === 'frequency');
    expect(rows).toHaveLength(freqs.length);
    rows.forEach((e, i) => {
      expect(e.colour).toBe(outlineColour(i));
      expect(e.short).toContain(`${freqs[i]} MHz (${outlineColourName(i)})`);
    });
    expect(outlineColourName(7)).toBe('indigo, 2nd');
    const cap = scenarioCaption(r.scenario, 0, { outlines: true });
    freqs.forEach((f, i) => expect(cap).toContain(`${f} MHz ${outlineColourName(i)} (FWHM`));
  });
});
