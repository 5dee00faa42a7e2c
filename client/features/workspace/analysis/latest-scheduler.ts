/**
 * The live-analysis scheduler: newest request wins.
 *
 * While the engine is busy with one request, later requests wait in a single slot; a newer request
 * replaces the waiting one, which then never runs (its promise settles as `stale`). A result is
 * delivered only if no newer result has been delivered already, so the screen never steps back to an
 * older design. The request that was already running when a newer one arrived still delivers (it is
 * the freshest finished work), which keeps the chart moving during a continuous drag instead of
 * waiting for the drag to stop.
 *
 * Pure: no timers, no DOM, no worker. The run function is injected (the worker client or the
 * main-thread engine, or a fake in tests).
 */

export type ScheduledOutcome<O> =
  | { status: 'done'; value: O; seq: number }
  | { status: 'failed'; error: unknown; seq: number }
  | { status: 'stale'; seq: number };

export interface LatestScheduler<I, O> {
  /** Ask for `input` to be run; resolves once it ran (done/failed) or was superseded (stale). Never rejects. */
  request(input: I): Promise<ScheduledOutcome<O>>;
  /** Requests made so far. */
  readonly issued: number;
  /** True while a request runs or waits. */
  readonly busy: boolean;
  /** Drop the waiting request and ignore the running one's result. */
  cancel(): void;
}

interface Waiting<I, O> {
  input: I;
  seq: number;
  settle: (o: ScheduledOutcome<O>) => void;
}

export function createLatestScheduler<I, O>(run: (input: I) => Promise<O>): LatestScheduler<I, O> {
  let issued = 0;
  let delivered = 0; // seq of the newest delivered (done or failed) outcome
  let cancelledUpTo = 0; // results of requests with seq <= this are dropped
  let running: Waiting<I, O> | null = null;
  let waiting: Waiting<I, O> | null = null;

  const start = (job: Waiting<I, O>): void => {
    running = job;
    let p: Promise<O>;
    try {
      p = Promise.resolve(run(job.input));
    } catch (error) {
      p = Promise.reject(error);
    }
    p.then(
      (value) => finish(job, { status: 'done', value, seq: job.seq }),
      (error: unknown) => finish(job, { status: 'failed', error, seq: job.seq }),
    );
  };

  const finish = (job: Waiting<I, O>, outcome: ScheduledOutcome<O>): void => {
    running = null;
    if (job.seq <= delivered || job.seq <= cancelledUpTo) job.settle({ status: 'stale', seq: job.seq });
    else {
      delivered = job.seq;
      job.settle(outcome);
    }
    const next = waiting;
    waiting = null;
    if (next) start(next);
  };

  return {
    request(input: I) {
      const seq = ++issued;
      return new Promise<ScheduledOutcome<O>>((settle) => {
        const job = { input, seq, settle };
        if (!running) {
          start(job);
          return;
        }
        if (waiting) waiting.settle({ status: 'stale', seq: waiting.seq });
        waiting = job;
      });
    },
    get issued() {
      return issued;
    },
    get busy() {
      return running !== null || waiting !== null;
    },
    cancel() {
      cancelledUpTo = issued;
      if (waiting) waiting.settle({ status: 'stale', seq: waiting.seq });
      waiting = null;
    },
  };
}
