/**
 * Buffers kept from one Monte Carlo run to the next by a thread that computes run after run (the
 * server's Monte Carlo worker, server/workers/mcm.worker.ts).
 *
 * A run of 10^6 trials needs about 16 MiB of typed arrays: the kept model values (8 MiB), one
 * column per input (512 KiB each), the chunk's model values and the two tail copies of the
 * coverage interval. Allocated afresh, they are garbage when the run ends, and V8 answers that
 * much memory outside its heap with a full mark-compact of the thread's heap, whose concurrent
 * marking runs on the process's shared helper threads at normal priority. In the server those
 * helpers compete with the API's thread even while the run's own thread sits in the background
 * (server/workers/thread-priority.ts); reusing the buffers removes that work.
 *
 * A buffer comes back holding whatever an earlier use left in it: every user in this folder writes
 * the part it reads first (`uint32Zeroed` clears its buffer). A workspace keeps the largest buffer
 * asked for under each name, so its memory is bounded by the engine's own limits (EXACT_CAPACITY
 * kept values, FINE_BINS bins, one chunk per column). It serves one run at a time, and nothing a
 * run returns refers to its buffers.
 */
export class McmWorkspace {
  private readonly float64s = new Map<string, Float64Array>();
  private readonly uint32s = new Map<string, Uint32Array>();

  /** A Float64Array of length n kept under `name`; its contents are left from earlier use. */
  float64(name: string, n: number): Float64Array {
    let b = this.float64s.get(name);
    if (!b || b.length < n) {
      b = new Float64Array(n);
      this.float64s.set(name, b);
    }
    return b.length === n ? b : b.subarray(0, n);
  }

  /** A Uint32Array of length n kept under `name`, every element 0. */
  uint32Zeroed(name: string, n: number): Uint32Array {
    let b = this.uint32s.get(name);
    if (!b || b.length < n) {
      b = new Uint32Array(n);
      this.uint32s.set(name, b);
      return b;
    }
    const part = b.length === n ? b : b.subarray(0, n);
    part.fill(0);
    return part;
  }

  /** Bytes held. */
  get bytes(): number {
    let total = 0;
    for (const b of this.float64s.values()) total += b.byteLength;
    for (const b of this.uint32s.values()) total += b.byteLength;
    return total;
  }
}

/** Float64Array of length n: from the workspace when there is one, else new. */
export function float64From(workspace: McmWorkspace | undefined, name: string, n: number): Float64Array {
  return workspace ? workspace.float64(name, n) : new Float64Array(n);
}
