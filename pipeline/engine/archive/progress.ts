/** Progress of a night's reductions: a bar on a terminal, nothing otherwise (cron, pipes). */
export interface Progress {
  start(series: string, total: number): void;
  update(done: number, total: number): void;
  stop(): void;
}

const silent: Progress = { start() {}, update() {}, stop() {} };

/**
 * A cli-progress bar on stderr (runs measured of the series' total, rate, ETA) when stderr is a
 * terminal and `enabled`; a no-op otherwise. cli-progress is loaded only then.
 */
export async function createProgress(enabled: boolean): Promise<Progress> {
  if (!enabled || !process.stderr.isTTY) return silent;
  const { default: cliProgress } = await import('cli-progress');
  const bar = new cliProgress.SingleBar(
    { format: '{series} |{bar}| {value}/{total} runs | {rate} runs/s | ETA {eta_formatted}', stream: process.stderr, hideCursor: true, clearOnComplete: true },
    cliProgress.Presets.shades_classic,
  );
  let t0 = 0;
  let first = 0;
  let series = '';
  let running = false;
  return {
    start(name, total) {
      series = name;
      t0 = performance.now();
      first = -1;
      bar.start(total, 0, { series, rate: '—' });
      running = true;
    },
    update(done, total) {
      if (!running) return;
      if (first < 0) first = done; // cache hits arrive at once: the rate counts measured runs only
      const s = (performance.now() - t0) / 1000;
      bar.setTotal(total);
      bar.update(done, { series, rate: s > 0 ? ((done - first) / s).toFixed(1) : '—' });
    },
    stop() {
      if (running) bar.stop();
      running = false;
    },
  };
}
