/**
 * Background priority for Monte Carlo threads: a run of 10^6–10^7 trials keeps a core busy for
 * seconds, while the API answers people who wait for each request. On Linux the nice value is an
 * attribute of each thread (setpriority(2), NOTES: "under the current Linux/NPTL implementation of
 * POSIX threads, the nice value is a per-thread attribute"), so a worker thread can lower its own
 * priority, and only its own: the API's thread keeps its share of the processor and a run uses
 * whatever is left. The thread id comes from /proc/thread-self (proc(5)).
 *
 * Raising a nice value needs no privilege; lowering it again does, so a thread only ever moves
 * towards the background (a later, smaller value is ignored).
 */
import { readlinkSync } from 'node:fs';
import { getPriority, setPriority } from 'node:os';

let applied = 0;

/** The calling thread's Linux thread id, or null where /proc/thread-self does not exist. */
export function currentThreadId(): number | null {
  try {
    const tid = Number(readlinkSync('/proc/thread-self').split('/').pop());
    return Number.isSafeInteger(tid) && tid > 0 ? tid : null;
  } catch {
    return null;
  }
}

/**
 * Give the calling thread the nice value `nice` (0–19; 0 leaves it alone). Returns the thread's
 * nice value afterwards, or null when the platform has no per-thread nice value (then nothing
 * changes: the run simply competes with the API as an equal).
 */
export function lowerThreadPriority(nice: number): number | null {
  const tid = currentThreadId();
  if (tid === null) return null;
  const target = Math.min(19, Math.max(0, Math.trunc(nice)));
  if (target > applied) {
    try {
      setPriority(tid, target);
      applied = target;
    } catch {
      return null;
    }
  }
  return getPriority(tid);
}
