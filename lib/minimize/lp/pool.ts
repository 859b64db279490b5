/**
 * Basis inverses handed back by released LPs, for reuse by the next LP of
 * the same search: a B⁻¹ of a few hundred rows is about a megabyte, and
 * allocating one per node LP kept the collector busy. One pool belongs to
 * one caller (a cover search, or the searches of one minimization); nothing
 * is shared between callers.
 */
export class BufferPool {
  private readonly free: Float64Array[] = [];

  /** A buffer of at least `size` entries whose first `zero` are zero, from the pool when one fits. */
  take(size: number, zero = size): Float64Array {
    const free = this.free;
    let best = -1;
    for (let k = 0; k < free.length; k++) {
      const len = free[k]!.length;
      if (len >= size && len <= 4 * size && (best < 0 || len < free[best]!.length)) best = k;
    }
    if (best < 0) return new Float64Array(size);
    // The whole buffer, not a view of its first `size` entries: the simplex ran slower on views.
    const buf = free.splice(best, 1)[0]!;
    buf.fill(0, 0, zero);
    return buf;
  }

  /** Hands a buffer back; the pool keeps the last four. */
  give(buf: Float64Array): void {
    if (buf.length === 0) return;
    if (this.free.length >= 4) this.free.shift();
    this.free.push(buf);
  }
}
