import { closeSync, fsyncSync, openSync, renameSync, unlinkSync, writeSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { randomBytes } from 'node:crypto';

// Atomic output (issue 6 item 4): every file goes to a temporary name in the
// same directory first; only when all of them are complete are they renamed
// to their final names (a rename within one directory is atomic on POSIX), so
// an interrupted run leaves no half-written output file. abort() removes the
// temporaries (also on SIGINT/SIGTERM, see plan.ts).

export class AtomicFileSet {
  private pending: { tmp: string; final: string }[] = [];

  /** Writes `chunks` (strings or bytes) to a temporary file that will become `finalPath`. */
  write(finalPath: string, chunks: Iterable<string | Uint8Array>): void {
    const tmp = join(dirname(finalPath), `.${basename(finalPath)}.tmp-${process.pid}-${randomBytes(4).toString('hex')}`);
    this.pending.push({ tmp, final: finalPath });
    const fd = openSync(tmp, 'wx', 0o644);
    try {
      for (const c of chunks) {
        const buf = typeof c === 'string' ? Buffer.from(c, 'utf8') : c;
        let off = 0;
        while (off < buf.length) off += writeSync(fd, buf, off, buf.length - off);
      }
      fsyncSync(fd);
    } finally {
      closeSync(fd);
    }
  }

  /** Renames every temporary file to its final name. */
  commit(): string[] {
    const done: string[] = [];
    for (const p of this.pending) {
      renameSync(p.tmp, p.final);
      done.push(p.final);
    }
    this.pending = [];
    return done;
  }

  /** Removes the temporary files not yet renamed. Safe to call more than once. */
  abort(): void {
    for (const p of this.pending) {
      try {
        unlinkSync(p.tmp);
      } catch {
        /* already gone */
      }
    }
    this.pending = [];
  }

  get temporaryPaths(): string[] {
    return this.pending.map((p) => p.tmp);
  }
}
