import type { Diagnostic } from '../../core/diagnostics/diagnostic.js';

const SQLITE_IO = /^SQLITE_(FULL|IOERR|READONLY|CANTOPEN|PERM)/;

/**
 * An error of the file system or of the ledger's storage — disk full (ENOSPC, SQLITE_FULL),
 * permissions (EACCES, EPERM), a read-only file system (EROFS, SQLITE_READONLY), quota, I/O —
 * as opposed to a bug. Any Node error carrying a syscall counts.
 */
export function isIoError(e: unknown): boolean {
  const err = e as { code?: unknown; syscall?: unknown };
  if (typeof err?.code !== 'string') return false;
  return typeof err.syscall === 'string' || SQLITE_IO.test(err.code);
}

/** The diagnostic for an output that could not be written. */
export function ioDiagnostic(e: unknown, what: string, path: string): Diagnostic {
  const err = e as NodeJS.ErrnoException;
  const hints: Record<string, string> = {
    ENOSPC: 'free disk space on the out-root file system, then run again',
    SQLITE_FULL: 'free disk space on the out-root file system, then run again',
    EDQUOT: 'the disk quota is exhausted: free space or raise the quota',
    EACCES: 'give the user running xsred write permission on the out-root',
    EPERM: 'give the user running xsred write permission on the out-root',
    EROFS: 'the out-root is on a read-only file system: remount it read-write or choose another --out',
  };
  const code = String(err.code ?? '');
  const hint = hints[code] ?? (code.startsWith('SQLITE_READONLY') ? hints.EROFS : 'check the out-root file system');
  return { severity: 'error', rule: 'output-not-written', stage: 'engine', file: err.path ?? path, message: `${what}: ${code} ${err.message}`.trim(), hint: `${hint}; the previous version and the ledger are unchanged` };
}
