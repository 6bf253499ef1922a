import type { Diagnostic } from '../diagnostics/diagnostic.js';

/** Error diagnostics of one file: the first `limit` kept, the rest counted into one summary. */
export class ProblemLog {
  readonly diagnostics: Diagnostic[] = [];
  errors = 0;
  constructor(
    readonly file: string,
    readonly limit = 10,
  ) {}

  add(d: Diagnostic): void {
    this.errors++;
    if (this.errors <= this.limit) this.diagnostics.push(d);
  }

  /** The kept diagnostics plus, when some were dropped, `…and N more problems in this file`. */
  finish(): Diagnostic[] {
    const extra = this.errors - this.limit;
    if (extra > 0) {
      this.diagnostics.push({
        severity: 'error',
        message: `…and ${extra} more problem${extra === 1 ? '' : 's'} in this file`,
        file: this.file,
        rule: 'spectrum-more-problems',
        actual: `${this.errors} problems`,
        hint: 'fix the problems listed above and read the file again',
      });
    }
    return this.diagnostics;
  }
}
