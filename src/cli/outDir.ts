import { mkdirSync, statSync } from 'node:fs';
import { UsageError, oneLine } from './errors';

/** Makes sure --out is a directory (creating it), or says in one line why it cannot be. */
export function prepareOutDir(dir: string, shown: string): void {
  try {
    if (!statSync(dir).isDirectory()) throw new UsageError(`--out ${oneLine(shown, 200)}: exists and is not a directory`);
    return;
  } catch (e) {
    if (e instanceof UsageError) throw e;
    if ((e as NodeJS.ErrnoException).code !== 'ENOENT') throw e;
  }
  try {
    mkdirSync(dir, { recursive: true });
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    if (code === 'ENOTDIR' || code === 'EEXIST') throw new UsageError(`--out ${oneLine(shown, 200)}: cannot be made (a part of the path is a file)`);
    if (code === 'EACCES' || code === 'EPERM' || code === 'EROFS') throw new UsageError(`--out ${oneLine(shown, 200)}: not allowed to create this directory`);
    throw e;
  }
}
