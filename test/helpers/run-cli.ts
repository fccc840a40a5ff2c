import { main, type CliIO } from '../../src/cli/main';

/**
 * Runs the `remap` command in-process over an in-memory file system (`files`,
 * written to by --out). Returns the exit code and what went to stdout and stderr.
 * A throw from `main` (it must return an exit code instead) fails loudly.
 */
export async function runCli(
  argv: string[],
  files: Record<string, string>,
): Promise<{ code: number; out: string; err: string; files: Record<string, string> }> {
  let out = '';
  let err = '';
  const io: CliIO = {
    stdout: (s) => (out += s),
    stderr: (s) => (err += s),
    readFile: (p) => {
      if (!Object.prototype.hasOwnProperty.call(files, p)) throw Object.assign(new Error('missing'), { code: 'ENOENT' });
      return files[p];
    },
    writeFile: (p, t) => {
      files[p] = t;
    },
  };
  let code: number;
  try {
    code = await main(argv, io);
  } catch (e) {
    throw new Error(`main threw instead of returning an exit code: ${(e as Error)?.stack ?? String(e)}`);
  }
  return { code, out, err, files };
}
