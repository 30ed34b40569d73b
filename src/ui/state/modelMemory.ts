import type { BeamModel, PatternTable } from '../../core/types';
import type { Draft } from './draft';
import type { KeyValueStore } from './recent';

// What the user typed for the beam models not in use. A scenario carries only
// the chosen model's fields (the parser refuses another model's beam fields,
// and the app leaves the aperture out for the models that do not use it), so
// the typed aperture, dipole length, ellipse sides... would be lost on a
// reload, an import or a recent scenario. The form keeps them here, in the
// browser beside the saved scenario, and puts them back wherever the scenario
// being opened does not set them.

export const MEMORY_KEY = 'swathe.form-models/1';

export interface ModelMemory {
  aperture: string;
  fwhmFactor: string;
  ellLength: string;
  ellWidth: string;
  ellAxis: string;
  dipLength: string;
  dipHeight: string;
  dipGround: boolean;
  dipAxis: string;
  table: PatternTable | null;
  tableSource: string;
}

type Key = keyof ModelMemory;

/** The memory fields a model writes into the scenario (what opening that scenario sets). */
export function carriedBy(model: BeamModel, dipGround: boolean): readonly Key[] {
  switch (model) {
    case 'gaussian':
    case 'airy':
      return ['aperture', 'fwhmFactor'];
    case 'elliptical_gaussian':
      return ['ellLength', 'ellWidth', 'ellAxis', 'fwhmFactor'];
    case 'dipole':
      // with no ground plane the height is written as null: the typed height is not carried
      return dipGround ? ['dipLength', 'dipHeight', 'dipGround', 'dipAxis'] : ['dipLength', 'dipGround', 'dipAxis'];
    case 'pattern':
      return ['table', 'tableSource'];
  }
}

export function memoryOf(d: Draft): ModelMemory {
  const a = d.ant;
  return {
    aperture: d.aperture, fwhmFactor: d.fwhmFactor,
    ellLength: a.ellLength, ellWidth: a.ellWidth, ellAxis: a.ellAxis,
    dipLength: a.dipLength, dipHeight: a.dipHeight, dipGround: a.dipGround, dipAxis: a.dipAxis,
    table: a.table, tableSource: a.tableSource,
  };
}

/** The draft with every field its scenario does not carry taken from the memory. */
export function withMemory(d: Draft, m: ModelMemory | null): Draft {
  if (!m) return d;
  const keep = new Set<Key>(carriedBy(d.beamModel, d.ant.dipGround));
  const pick = <K extends Key>(k: K, own: ModelMemory[K]): ModelMemory[K] => (keep.has(k) ? own : m[k]);
  const a = d.ant;
  return {
    ...d,
    aperture: pick('aperture', d.aperture),
    fwhmFactor: pick('fwhmFactor', d.fwhmFactor),
    ant: {
      ...a,
      ellLength: pick('ellLength', a.ellLength), ellWidth: pick('ellWidth', a.ellWidth), ellAxis: pick('ellAxis', a.ellAxis),
      dipLength: pick('dipLength', a.dipLength), dipHeight: pick('dipHeight', a.dipHeight),
      dipGround: pick('dipGround', a.dipGround), dipAxis: pick('dipAxis', a.dipAxis),
      table: pick('table', a.table), tableSource: pick('tableSource', a.tableSource),
    },
  };
}

const TEXT_KEYS = ['aperture', 'fwhmFactor', 'ellLength', 'ellWidth', 'ellAxis', 'dipLength', 'dipHeight', 'dipAxis', 'tableSource'] as const;

/** The stored memory, or null when there is none or it is not in this shape (never throws). */
export function readMemory(store: KeyValueStore | null): ModelMemory | null {
  try {
    const text = store?.getItem(MEMORY_KEY);
    if (!text) return null;
    const v = JSON.parse(text) as Record<string, unknown>;
    if (!v || typeof v !== 'object' || typeof v.dipGround !== 'boolean') return null;
    if (!TEXT_KEYS.every((k) => typeof v[k] === 'string')) return null;
    const t = v.table as PatternTable | null;
    const tableOk = t === null || (typeof t === 'object' && Array.isArray(t.zenith_deg) && Array.isArray(t.gain_db));
    return { ...(v as unknown as ModelMemory), table: tableOk ? t : null };
  } catch {
    return null;
  }
}

/** Stores the memory; a pattern table too large for the storage is left out rather than the rest. */
export function writeMemory(store: KeyValueStore | null, m: ModelMemory): void {
  if (!store) return;
  try {
    store.setItem(MEMORY_KEY, JSON.stringify(m));
  } catch {
    try {
      store.setItem(MEMORY_KEY, JSON.stringify({ ...m, table: null, tableSource: '' }));
    } catch {
      // storage full or disabled: the scenario's own save reports that
    }
  }
}
