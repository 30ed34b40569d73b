// The Python that outside checks run under, and what to do when it lacks a
// module: skip on a developer's machine, fail loudly under CI=true (.ci/run
// installs Debian's python3-healpy, python3-astropy and python3-scipy).
// SWATHE_PYTHON points the checks at another interpreter (to try the CI
// failure: SWATHE_PYTHON=/usr/bin/false CI=true npx vitest run tests/reference).
import { spawnSync } from 'node:child_process';

export const PY = process.env.SWATHE_PYTHON || '/usr/bin/python3';
export const IN_CI = process.env.CI === 'true';

const DEBIAN: Record<string, string> = {
  healpy: 'python3-healpy', astropy: 'python3-astropy', 'astropy.coordinates': 'python3-astropy',
  'astropy.io.fits': 'python3-astropy', scipy: 'python3-scipy', 'scipy.special': 'python3-scipy', numpy: 'python3-numpy',
};

const cache = new Map<string, boolean>();

/** True when PY imports every module. */
export function pythonHas(modules: string[]): boolean {
  const key = modules.join(',');
  let ok = cache.get(key);
  if (ok === undefined) {
    const r = spawnSync(PY, ['-c', modules.map((m) => `import ${m}`).join('\n')], { stdio: 'ignore', timeout: 120_000 });
    ok = r.status === 0;
    cache.set(key, ok);
  }
  return ok;
}

/**
 * True when the check can run. When it cannot and CI=true, throws at once
 * (the whole test file fails with this message), never a skip.
 */
export function requirePython(modules: string[], what: string): boolean {
  if (pythonHas(modules)) return true;
  if (IN_CI) {
    const pkgs = [...new Set(modules.map((m) => DEBIAN[m] ?? m))].join(' ');
    throw new Error(`CI=true: ${PY} cannot import ${modules.join(', ')}, which ${what} needs. Install ${pkgs} (Debian), as .ci/run does. A reference check never skips in CI.`);
  }
  return false;
}
