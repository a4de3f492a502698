/**
 * Byte runs of a hyperslab in a row-major array stored at fixed byte strides (NetCDF classic
 * layout). The innermost dimensions read in full merge with the first partial one into one
 * contiguous run; a record dimension (stride = record size) never merges with what is inside it.
 */
export interface HyperslabRuns {
  /** Bytes per run. */
  readonly runBytes: number;
  /** Byte offset of each run from the variable's begin, in row-major order of the runs. */
  readonly offsets: readonly number[];
}

export function hyperslabRuns(
  shape: readonly number[],
  strides: readonly number[],
  elementSize: number,
  start: readonly number[],
  count: readonly number[],
  firstIsRecord: boolean,
): HyperslabRuns {
  const nd = shape.length;
  if (nd === 0) return { runBytes: elementSize, offsets: [0] };
  // k = the outermost dimension that is part of the contiguous run.
  let k = nd - 1;
  while (k > 0 && count[k] === shape[k] && !(k - 1 === 0 && firstIsRecord)) k--;
  if (k === 0 && firstIsRecord && nd > 1) k = 1;
  if (k === 0 && firstIsRecord && nd === 1) {
    // Each record holds one element of this variable.
    const offsets: number[] = [];
    for (let r = 0; r < count[0]; r++) offsets.push((start[0] + r) * strides[0]);
    return { runBytes: elementSize, offsets };
  }
  let inner = elementSize;
  for (let i = k + 1; i < nd; i++) inner *= shape[i];
  const runBytes = count[k] * inner;
  const offsets: number[] = [];
  const idx = new Array<number>(k).fill(0);
  const base = start[k] * strides[k];
  for (;;) {
    let off = base;
    for (let i = 0; i < k; i++) off += (start[i] + idx[i]) * strides[i];
    offsets.push(off);
    let d = k - 1;
    while (d >= 0) {
      idx[d]++;
      if (idx[d] < count[d]) break;
      idx[d] = 0;
      d--;
    }
    if (d < 0) break;
  }
  return { runBytes, offsets };
}
