// CLI outcomes. A user's mistake (bad flags, a missing or bad scenario file,
// a scenario beyond the run limits) exits 2 with one line naming the field;
// anything else exits 1 with one line. Never a stack trace unless asked for
// (SWATHE_DEBUG=1).

export const EXIT_OK = 0;
export const EXIT_FAILURE = 1;
export const EXIT_BAD_INPUT = 2;

/** Bad command line: unknown option, missing argument, ... */
export class UsageError extends Error {
  override name = 'UsageError';
}

/** Bad input data: the scenario file, its contents, its run limits. */
export class InputError extends Error {
  override name = 'InputError';
}

/** One printable line: control characters (newlines included) become spaces, long text is cut. */
export function oneLine(text: string, max = 2000): string {
  // eslint-disable-next-line no-control-regex
  const s = text.replace(/\s*[\u0000-\u001f\u007f-\u009f]+\s*/g, ' ').trim();
  return s.length > max ? s.slice(0, max - 3) + '...' : s;
}
