// One-line messages and the one way scripts stop on a fault.

/** A fault the user can act on: the message is one line saying what happened and what to do. */
export class ScriptError extends Error {
  /** @param {string} message @param {string} [detail] extra lines printed below (e.g. a log tail) */
  constructor(message, detail) {
    super(message);
    this.name = 'ScriptError';
    this.detail = detail;
  }
}

export function info(message) {
  process.stdout.write(`[phasewright] ${message}\n`);
}

/** Print a fault and exit non-zero; unknown errors keep their stack for debugging. */
export function fail(error) {
  if (error instanceof ScriptError) {
    if (error.detail) process.stderr.write(`${error.detail.trimEnd()}\n`);
    process.stderr.write(`[phasewright] error: ${error.message}\n`);
  } else {
    process.stderr.write(`[phasewright] unexpected error: ${error?.stack ?? String(error)}\n`);
  }
  process.exit(1);
}

/** Run an async main and route every fault through `fail`. */
export function runMain(main) {
  main().catch(fail);
}

/**
 * Call `cb` once when this process's parent goes away. `npm start` runs us through `sh -c`; a
 * SIGTERM sent to npm ends npm and sh but is not passed on to us, so we watch for that.
 */
export function onParentExit(cb) {
  const parent = process.ppid;
  const timer = setInterval(() => {
    if (process.ppid !== parent) {
      clearInterval(timer);
      cb();
    }
  }, 500);
  timer.unref();
}
