import { execFile } from 'node:child_process';
import { fileURLToPath } from 'node:url';

/** The compiled command line (`npm test` builds dist/ before vitest runs). */
export const CLI_PATH = fileURLToPath(new URL('../../dist/pipeline/engine/cli.js', import.meta.url));
export const REPO_ROOT = fileURLToPath(new URL('../../', import.meta.url));

export interface CliResult {
  code: number;
  stdout: string;
  stderr: string;
}

/**
 * Runs `node dist/pipeline/engine/cli.js …args` as a child process (stdout and stderr are
 * pipes, so the log is JSON lines) and resolves with its exit code and output, whatever the code.
 * @param cwd working folder of the child (default: the repository root)
 */
export function runCli(args: readonly string[], cwd: string = REPO_ROOT): Promise<CliResult> {
  return new Promise((resolve, reject) => {
    execFile(process.execPath, [CLI_PATH, ...args], { cwd, maxBuffer: 64 * 1024 * 1024, encoding: 'utf8' }, (error, stdout, stderr) => {
      if (error !== null && typeof error.code !== 'number') {
        reject(error);
        return;
      }
      resolve({ code: error === null ? 0 : (error.code as number), stdout, stderr });
    });
  });
}
