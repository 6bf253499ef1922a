import { existsSync, realpathSync, statSync } from 'node:fs';
import { join } from 'node:path';
import type { Diagnostic } from '../../core/diagnostics/diagnostic.js';

/**
 * The folder holding one reduction's files: `<out>/<series>` itself (what `xsred reduce`
 * writes), or, for an archive series folder, the version its `current` link points to
 * (`<series>/current → versions/<V>/`). The link is resolved once, so a swap during an export
 * does not mix two versions.
 */
export function resolveReductionDir(dir: string): { dir: string; version?: string } | { diagnostic: Diagnostic } {
  const current = join(dir, 'current');
  if (existsSync(current)) {
    const real = realpathSync(current);
    if (existsSync(join(real, 'cross_sections.arrow'))) return { dir: real, version: real.split(/[\\/]/).filter(Boolean).pop() };
    return { diagnostic: { severity: 'error', stage: 'report', rule: 'export-current-incomplete', file: current, message: `${current} points to ${real}, which holds no cross_sections.arrow`, hint: 'let the running reduction finish, or point current at a complete version' } };
  }
  if (existsSync(join(dir, 'cross_sections.arrow'))) return { dir };
  const what = existsSync(dir) ? (statSync(dir).isDirectory() ? 'a folder without cross_sections.arrow or a current link' : 'not a folder') : 'missing';
  return {
    diagnostic: {
      severity: 'error',
      stage: 'report',
      rule: 'export-not-a-reduction',
      file: dir,
      message: `${dir}: ${what}`,
      expected: '<out>/<series> written by xsred reduce, or an archive series folder with current → versions/<V>/',
      hint: 'pass the series folder inside the --out folder of xsred reduce',
    },
  };
}
