/** Binary max-heap of (score, column): higher score first, lower column among equal scores. */
export class ScoreHeap {
  private readonly score: Float64Array;
  private readonly col: Int32Array;
  size = 0;
  constructor(capacity: number) {
    this.score = new Float64Array(capacity);
    this.col = new Int32Array(capacity);
  }
  private before(i: number, j: number): boolean {
    const a = this.score[i]!;
    const b = this.score[j]!;
    return a > b || (a === b && this.col[i]! < this.col[j]!);
  }
  private swap(i: number, j: number): void {
    const s = this.score[i]!;
    this.score[i] = this.score[j]!;
    this.score[j] = s;
    const c = this.col[i]!;
    this.col[i] = this.col[j]!;
    this.col[j] = c;
  }
  topScore(): number {
    return this.score[0]!;
  }
  topCol(): number {
    return this.col[0]!;
  }
  push(score: number, col: number): void {
    let i = this.size++;
    this.score[i] = score;
    this.col[i] = col;
    while (i > 0) {
      const parent = (i - 1) >> 1;
      if (!this.before(i, parent)) break;
      this.swap(i, parent);
      i = parent;
    }
  }
  pop(): void {
    const last = --this.size;
    if (last === 0) return;
    this.score[0] = this.score[last]!;
    this.col[0] = this.col[last]!;
    for (let i = 0; ; ) {
      const l = 2 * i + 1;
      const r = l + 1;
      let m = i;
      if (l < last && this.before(l, m)) m = l;
      if (r < last && this.before(r, m)) m = r;
      if (m === i) break;
      this.swap(i, m);
      i = m;
    }
  }
}
