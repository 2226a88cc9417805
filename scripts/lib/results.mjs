// Pass/fail counts of each suite and the one summary line `N passed, N failed`.
import fs from 'node:fs';

export class Tally {
  constructor() {
    /** @type {{suite: string, passed: number, failed: number, skipped: number, note?: string}[]} */
    this.rows = [];
    this.lastMark = Date.now();
  }

  /** `seconds` defaults to the time since the previous row or mark (pass it for parallel jobs). */
  add(suite, passed, failed, skipped = 0, note = undefined, seconds = undefined) {
    const now = Date.now();
    this.rows.push({ suite, passed, failed, skipped, note, seconds: seconds ?? (now - this.lastMark) / 1000 });
    this.lastMark = now;
  }

  /** Start timing the next row (rows report the time since the previous row or mark). */
  mark() {
    this.lastMark = Date.now();
  }

  /**
   * Counts from a vitest or jest JSON report. A run that exited non-zero but reported no failed
   * test (a crash, a file that did not compile) counts as one failure.
   */
  addJsonReport(suite, file, exitCode) {
    let report = null;
    try {
      report = JSON.parse(fs.readFileSync(file, 'utf8'));
    } catch {
      // no report: the runner did not get far enough to write one
    }
    if (!report) {
      this.add(suite, 0, 1, 0, `no test report (exit ${exitCode})`);
      return;
    }
    const passed = report.numPassedTests ?? 0;
    let failed = report.numFailedTests ?? 0;
    const skipped = (report.numPendingTests ?? 0) + (report.numTodoTests ?? 0);
    const brokenFiles = report.numRuntimeErrorTestSuites ?? 0;
    failed += brokenFiles;
    let note;
    if (brokenFiles) note = `${brokenFiles} test file(s) failed to run`;
    if (exitCode !== 0 && failed === 0) {
      failed = 1;
      note = `runner exited with ${exitCode}`;
    }
    this.add(suite, passed, failed, skipped, note);
  }

  get passed() {
    return this.rows.reduce((s, r) => s + r.passed, 0);
  }

  get failed() {
    return this.rows.reduce((s, r) => s + r.failed, 0);
  }

  table() {
    const width = Math.max(...this.rows.map((r) => r.suite.length), 5);
    const lines = this.rows.map(
      (r) =>
        `  ${r.failed ? 'FAIL' : 'ok  '} ${r.suite.padEnd(width)} ${r.seconds.toFixed(1).padStart(6)} s ${String(r.passed).padStart(5)} passed ${String(r.failed).padStart(3)} failed` +
        (r.skipped ? `  ${r.skipped} skipped` : '') +
        (r.note ? `  (${r.note})` : ''),
    );
    return lines.join('\n');
  }

  /** The last line of `npm test`. */
  summary() {
    return `${this.passed} passed, ${this.failed} failed`;
  }
}
