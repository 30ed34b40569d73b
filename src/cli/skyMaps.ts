import { readFileSync, statSync } from 'node:fs';
import { resolve } from 'node:path';
import type { Scenario } from '../core/types';
import { readHealpixFits, SkyMapError, SKY_MAP_LIMITS } from '../core/sky/fitsMap';
import { checkSkyMaps, type LoadedSkyMap } from '../core/sky/model';
import { InputError, oneLine } from './errors';

/**
 * Reads the HEALPix FITS maps of `sky.maps` (paths relative to the scenario
 * file's folder); null when the sky model needs none. Every problem is an
 * InputError naming the field and the file.
 */
export function readSkyMaps(s: Scenario, baseDir: string): LoadedSkyMap[] | null {
  if (s.sky?.model !== 'map' || !s.sky.maps) return null;
  const out: LoadedSkyMap[] = s.sky.maps.map((m, i) => {
    const field = `sky.maps[${i}].file`;
    const shown = oneLine(m.file, 200);
    const full = resolve(baseDir, m.file);
    let size: number;
    try {
      const st = statSync(full);
      if (st.isDirectory()) throw new InputError(`${field}: ${shown} is a directory, not a sky map`);
      size = st.size;
    } catch (e) {
      if (e instanceof InputError) throw e;
      const code = (e as NodeJS.ErrnoException).code;
      if (code === 'ENOENT' || code === 'ENOTDIR') throw new InputError(`${field}: no such sky map ${shown} (paths are relative to the scenario file's folder)`);
      if (code === 'EACCES' || code === 'EPERM') throw new InputError(`${field}: not allowed to read the sky map ${shown}`);
      throw e;
    }
    if (size > SKY_MAP_LIMITS.max_file_bytes) {
      throw new InputError(`${field}: ${shown} is ${(size / 1048576).toFixed(0)} MB, more than the ${SKY_MAP_LIMITS.max_file_bytes / 1048576} MB a sky map may have (degrade it to nside 512 or less first)`);
    }
    try {
      return { file: m.file, frequency_mhz: m.frequency_mhz, map: readHealpixFits(readFileSync(full), `${field} (${shown})`) };
    } catch (e) {
      if (e instanceof SkyMapError) throw new InputError(e.message);
      throw e;
    }
  });
  try {
    checkSkyMaps(s.sky, out);
  } catch (e) {
    if (e instanceof SkyMapError) throw new InputError(e.message);
    throw e;
  }
  return out;
}
