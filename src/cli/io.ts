// What a command may touch of its surroundings; tests pass their own.
export interface CliIo {
  out(text: string): void;
  err(text: string): void;
  /** Whether stderr is a terminal (progress is shown then, or with --progress). */
  errIsTTY: boolean;
  env: Record<string, string | undefined>;
  cwd: string;
}

export function processIo(): CliIo {
  return {
    out: (t) => void process.stdout.write(t),
    err: (t) => void process.stderr.write(t),
    errIsTTY: Boolean(process.stderr.isTTY),
    env: process.env,
    cwd: process.cwd(),
  };
}
