/**
 * Background work run in turns that let I/O through: tasks run in order, and after a turn has used
 * `budgetMs` the rest wait for the next turn of the event loop (setImmediate, which comes after the
 * poll for socket data). Timers that fall due together all run in one timers phase; the rooms' room-log
 * describing (one timer per room, 500 ms after its last edit) ran that way: in bench:collab's 50 rooms,
 * runs of describes held the event loop 20–35 ms while edits waited to be relayed. Through this queue
 * a run of them gives way to the sockets about every millisecond.
 */
export interface YieldingQueue {
  push(task: () => void): void;
  /** tasks waiting */
  readonly size: number;
}

/** By default a task's error is thrown again on its own turn (as from the timer it replaces), after the other tasks. */
const rethrow = (e: unknown) =>
  setImmediate(() => {
    throw e;
  });

export function createYieldingQueue(budgetMs = 1, onError: (e: unknown) => void = rethrow): YieldingQueue {
  const tasks: (() => void)[] = [];
  let scheduled = false;
  const drain = () => {
    scheduled = false;
    const start = performance.now();
    while (tasks.length > 0) {
      const task = tasks.shift()!;
      try {
        task();
      } catch (e) {
        onError(e);
      }
      if (tasks.length > 0 && performance.now() - start >= budgetMs) {
        schedule();
        return;
      }
    }
  };
  const schedule = () => {
    if (scheduled) return;
    scheduled = true;
    setImmediate(drain);
  };
  return {
    push(task) {
      tasks.push(task);
      schedule();
    },
    get size() {
      return tasks.length;
    },
  };
}

/** The collab server's queue for room-log describing (shared by every room of the process). */
export const backgroundQueue = createYieldingQueue(1);
