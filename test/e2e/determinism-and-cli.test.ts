import { createHash } from 'node:crypto';
import { cpSync, existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { simulateSeries } from '../../pipeline/simulate/simulate-series.js';
import { simulationSpecSchema } from '../../pipeline/simulate/simulation-spec.js';
import { REPO_ROOT, runCli, type CliResult } from './run-cli.js';
import { separatedPeaksSpec } from './separated-peaks-spec.js';

const root = mkdtempSync(join(tmpdir(), 'xsred-e2e-cli-'));
afterAll(() => rmSync(root, { recursive: true, force: true }));

const spec = simulationSpecSchema.parse(separatedPeaksSpec());
const TABLES = ['cross_sections.arrow', 'normalization.arrow', 'yields.arrow', 'qc.arrow'] as const;
const TIME_KEYS = ['started_at', 'finished_at'];

let seriesDir: string;
let smallDir: string;

/** A 3-energy, 1-calibration variant of the test spec, for the argument and input-error cases. */
function smallSpec(extra: Parameters<typeof separatedPeaksSpec>[0] = {}) {
  const base = separatedPeaksSpec();
  return separatedPeaksSpec({
    energies_keV: [2000, 2500, 3000],
    calibrations: [base.calibrations[0]!],
    scalers: { pulser_rate_hz: 60, modes: [{ from_run_index: 1, mode: 'live_time' }, { from_run_index: 3, mode: 'pulser' }] },
    ...extra,
  });
}

/** A copy of the small series with one file edited. */
function variant(name: string, file: string, edit: (text: string) => string): string {
  const dir = join(root, 'variants', name);
  cpSync(smallDir, dir, { recursive: true });
  const path = join(dir, file);
  const before = readFileSync(path, 'utf8');
  const after = edit(before);
  expect(after, `${name}: the edit changed ${file}`).not.toBe(before);
  writeFileSync(path, after);
  return dir;
}

const lineNumberOf = (text: string, needle: string) => text.split('\n').findIndex((l) => l.includes(needle)) + 1;
const noStackTrace = (stderr: string) => !/^\s+at .+:\d+:\d+\)?$/m.test(stderr) && !/internal error/.test(stderr);

beforeAll(() => {
  seriesDir = simulateSeries(spec, join(root, 'in')).seriesDir;
  smallDir = simulateSeries(smallSpec(), join(root, 'in-small')).seriesDir;
});

describe('determinism: the same inputs give byte-identical tables (README, "Outputs")', () => {
  const outs: Record<string, string> = {};
  const snapshot: Record<string, Buffer> = {};
  let firstRun: CliResult;
  let runs: Record<string, CliResult>;

  beforeAll(async () => {
    outs.first = join(root, 'out-a');
    outs.jobs1 = join(root, 'out-j1');
    outs.jobs2 = join(root, 'out-j2');
    firstRun = await runCli(['reduce', seriesDir, '--out', outs.first]);
    for (const f of [...TABLES, 'manifest.json', 'diagnostics.json']) snapshot[f] = readFileSync(join(outs.first, spec.series, f));
    const [again, jobs1, jobs2] = await Promise.all([
      runCli(['reduce', seriesDir, '--out', outs.first]),
      runCli(['reduce', seriesDir, '--out', outs.jobs1, '--jobs', '1']),
      runCli(['reduce', seriesDir, '--out', outs.jobs2, '--jobs', '2']),
    ]);
    runs = { again: again!, jobs1: jobs1!, jobs2: jobs2! };
  });

  it('exits 0 every time and prints the output folder and the summary path on stdout, nothing else', () => {
    expect(firstRun.code).toBe(0);
    expect(firstRun.stdout).toBe(`${join(outs.first, spec.series)}\n${join(outs.first, spec.series, 'summary.html')}\n`);
    for (const [name, r] of Object.entries(runs)) expect(r.code, name).toBe(0);
    expect(runs.jobs1!.stdout).toBe(`${join(outs.jobs1, spec.series)}\n${join(outs.jobs1, spec.series, 'summary.html')}\n`);
  });

  it('writes the four Arrow tables and diagnostics.json byte for byte the same: again, with --jobs 1 and with --jobs 2', () => {
    const where = { again: outs.first, jobs1: outs.jobs1, jobs2: outs.jobs2 };
    for (const [name, dir] of Object.entries(where)) {
      for (const f of [...TABLES, 'diagnostics.json']) {
        const bytes = readFileSync(join(dir!, spec.series, f));
        expect(bytes.equals(snapshot[f]!), `${name}: ${f} differs from the first run`).toBe(true);
      }
    }
  });

  it('writes manifest.json that differs only in its start and finish times (same command line), and only in those and the command line across --jobs', () => {
    const first = JSON.parse(snapshot['manifest.json']!.toString('utf8')) as Record<string, unknown>;
    const again = JSON.parse(readFileSync(join(outs.first, spec.series, 'manifest.json'), 'utf8')) as Record<string, unknown>;
    const strip = (m: Record<string, unknown>, keys: string[]) => Object.fromEntries(Object.entries(m).filter(([k]) => !keys.includes(k)));
    for (const k of TIME_KEYS) expect(typeof first[k], k).toBe('string');
    expect(strip(again, TIME_KEYS)).toEqual(strip(first, TIME_KEYS));
    for (const dir of [outs.jobs1, outs.jobs2]) {
      const m = JSON.parse(readFileSync(join(dir!, spec.series, 'manifest.json'), 'utf8')) as Record<string, unknown>;
      expect(strip(m, [...TIME_KEYS, 'command_line'])).toEqual(strip(first, [...TIME_KEYS, 'command_line']));
      expect(m.config_sha256).toBe(first.config_sha256);
      expect(m.inputs_sha256).toBe(first.inputs_sha256);
      expect(m.input_files).toEqual(first.input_files);
    }
    expect(first.exit_code).toBe(0);
    expect(Object.keys(first.input_files as object)).toContain('series.yaml');
    expect(first.config_sha256).toMatch(/^[0-9a-f]{64}$/);
  });

  it("writes a summary.html that needs no network and runs only its own picker: one <script>, pinned by the CSP's sha256 (W3C CSP Level 3), no http(s) reference (only the SVG namespace names)", () => {
    const html = readFileSync(join(outs.first, spec.series, 'summary.html'), 'utf8');
    const scripts = [...html.matchAll(/<script>([\s\S]*?)<\/script>/gi)].map((m) => m[1]!);
    expect(scripts).toHaveLength(1);
    expect(html.match(/<script/gi)).toHaveLength(1);
    const csp = (/http-equiv="Content-Security-Policy" content="([^"]*)"/.exec(html)?.[1] ?? '').replace(/&#39;/g, "'");
    expect(csp).toContain("default-src 'none'");
    expect(csp).toContain(`'sha256-${createHash('sha256').update(scripts[0]!).digest('base64')}'`);
    // xmlns="http://www.w3.org/2000/svg" names a namespace; browsers never fetch it. Anything else is a reference.
    const withoutNamespaces = html.replace(/\sxmlns(:[a-z]+)?="http:\/\/www\.w3\.org\/(2000\/svg|1999\/xlink)"/g, '');
    expect(withoutNamespaces.match(/.{0,60}https?:\/\/.{0,60}/g) ?? []).toEqual([]);
    expect(html).not.toMatch(/(?:href|src)\s*=\s*["']?\s*\/\//i);
    expect(html).not.toMatch(/@import|url\(\s*['"]?\s*(?:https?:)?\/\//i);
  });
});

describe('command-line contract (README, "Command line" and "Exit codes")', () => {
  it('--version prints package.json\'s version and exits 0', async () => {
    const pkg = JSON.parse(readFileSync(join(REPO_ROOT, 'package.json'), 'utf8')) as { version: string };
    const r = await runCli(['--version']);
    expect(r.code).toBe(0);
    expect(r.stdout.trim()).toBe(pkg.version);
  });

  it('--help and reduce --help exit 0 and list the exit codes 0, 1, 2 and 3', async () => {
    for (const args of [['--help'], ['reduce', '--help']]) {
      const r = await runCli(args);
      expect(r.code, args.join(' ')).toBe(0);
      expect(r.stdout).toMatch(/exit codes/i);
      for (const code of ['0', '1', '2', '3']) expect(r.stdout, `${args.join(' ')}: code ${code}`).toMatch(new RegExp(`^\\s*${code}\\s+\\S`, 'm'));
    }
  });

  it('a missing series folder exits 2 with a message naming it on stderr, no stack trace, nothing written', async () => {
    const missing = join(root, 'no-such-series');
    const out = join(root, 'out-missing');
    const r = await runCli(['reduce', missing, '--out', out]);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain(missing);
    expect(noStackTrace(r.stderr)).toBe(true);
    expect(r.stdout).toBe('');
    expect(existsSync(out)).toBe(false);
  });

  it('a YAML syntax error in series.yaml exits 2 and names series.yaml:<line>:<col> of the stray bracket', async () => {
    let line = 0;
    let column = 0;
    const dir = variant('yaml-syntax', 'series.yaml', (t) => {
      const edited = t.replace('beam: { projectile: 4He, charge_state: 1 }', 'beam: { projectile: 4He, charge_state: 1 ]');
      line = lineNumberOf(edited, 'beam: {');
      column = edited.split('\n')[line - 1]!.indexOf(']') + 1;
      return edited;
    });
    const out = join(root, 'out-yaml-syntax');
    const r = await runCli(['reduce', dir, '--out', out]);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain(`series.yaml:${line}:${column}:`);
    expect(noStackTrace(r.stderr)).toBe(true);
    expect(existsSync(join(out, spec.series))).toBe(false);
  });

  it('a schema error (angle_deg: "150 deg") exits 2 and names the key and series.yaml:<line>:<col> of the value', async () => {
    let line = 0;
    let column = 0;
    const dir = variant('schema', 'series.yaml', (t) => {
      const edited = t.replace(/(id: d02, angle_deg: )150,/, '$1"150 deg",');
      line = lineNumberOf(edited, '"150 deg"');
      column = edited.split('\n')[line - 1]!.indexOf('"150 deg"') + 1;
      return edited;
    });
    const out = join(root, 'out-schema');
    const r = await runCli(['reduce', dir, '--out', out]);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain(`series.yaml:${line}:${column}:`);
    expect(r.stderr).toMatch(/angle_deg/);
    expect(noStackTrace(r.stderr)).toBe(true);
    expect(existsSync(join(out, spec.series))).toBe(false);
  });

  it('a series with no reference run (every reference run relabelled background) exits 2 and writes nothing', async () => {
    const dir = variant('no-reference', 'runlog.csv', (t) => t.replace(/,reference,/g, ',background,'));
    const out = join(root, 'out-no-reference');
    const r = await runCli(['reduce', dir, '--out', out]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/reference/);
    expect(noStackTrace(r.stderr)).toBe(true);
    expect(r.stdout).toBe('');
    expect(existsSync(join(out, spec.series))).toBe(false);
  });
});

describe('summary.html escapes what series.yaml and runlog.csv say (OWASP XSS prevention: HTML-encode untrusted text)', () => {
  const titlePayload = '<script>alert(1)</script>';
  const tagPayload = '"><img src=x onerror=alert(1)>';
  let html: string;
  let r: CliResult;

  beforeAll(async () => {
    const base = smallSpec({ series: 'bkw-2026-escape', title: `Escape check ${titlePayload}` });
    base.peaks[1] = { ...base.peaks[1]!, label: `O-16 ${tagPayload}` };
    const dir = simulateSeries(base, join(root, 'in-escape')).seriesDir;
    // A note on the first sample run (RFC 4180 quoting: quotes doubled).
    const runlog = readFileSync(join(dir, 'runlog.csv'), 'utf8').split('\n');
    const i = runlog.findIndex((l) => l.includes(',sample,'));
    runlog[i] = runlog[i]!.replace(/,$/, `,"note ${tagPayload.replace(/"/g, '""')}"`);
    writeFileSync(join(dir, 'runlog.csv'), runlog.join('\n'));
    r = await runCli(['reduce', dir, '--out', join(root, 'out-escape')]);
    html = readFileSync(join(root, 'out-escape', 'bkw-2026-escape', 'summary.html'), 'utf8');
  });

  it('reduces the series (exit 0)', () => {
    expect(r.code).toBe(0);
  });

  it('shows the title and the peak label escaped, never raw', () => {
    expect(html).not.toContain(titlePayload);
    // The page's one script is its own picker (pinned by the CSP); nothing a user wrote becomes one.
    expect(html.match(/<script/gi)).toHaveLength(1);
    expect(html).not.toContain('<script>alert');
    expect(html).toContain('&lt;script&gt;alert(1)&lt;/script&gt;');
    expect(html).not.toContain(tagPayload);
    expect(html).not.toMatch(/<img/i);
    expect(html).toContain('&lt;img src=x onerror=alert(1)&gt;');
  });
});
