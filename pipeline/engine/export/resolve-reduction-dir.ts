import { existsSync, lstatSync, readlinkSync, realpathSync, statSync } from 'node:fs';
import { basename, join, resolve } from 'node:path';
import type { Diagnostic } from '../../core/diagnostics/diagnostic.js';

/**
 * The folder holding one reduction's files: `<out>/<series>` itself (what `xsred reduce`
 * writes), or, for an archive series folder, the version its `current` link points to
 * (`<series>/current → versions/<V>/`, a symbolic link). The link is read once and the export
 * reads the folder it named, so a swap during an export does not mix two versions.
 */
export function resolveReductionDir(dir: string): { dir: string; version?: string } | { diagnostic: Diagnostic } {
  const current = join(dir, 'current');
  const link = existsSync(dir) && statSync(dir).isDirectory() ? lstatSync(current, { throwIfNoEntry: false }) : undefined;
  if (link !== undefined) {
    const fail = (rule: string, message: string, hint: string): { diagnostic: Diagnostic } => ({ diagnostic: { severity: 'error', stage: 'report', rule, file: current, message, expected: 'current → versions/<V> (a symbolic link)', hint } });
    if (!link.isSymbolicLink()) return fail('export-current-not-a-link', `${current} is not a symbolic link`, 'an out-root written by an older xsred keeps a pointer file: run xsred nightly or rereduce once to replace it by the link');
    const target = readlinkSync(current);
    const real = resolve(dir, target);
    if (!existsSync(join(real, 'cross_sections.arrow'))) return fail('export-current-incomplete', `${current} points to ${target}, which holds no cross_sections.arrow`, 'let the running reduction finish, or point current at a complete version');
    return { dir: realpathSync(real), version: basename(real) };
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
