/** A growing list of pixel indices kept in one typed array, reused between queries. */
export interface IndexList {
  length: number;
  values: Uint32Array;
}

export function newIndexList(capacity = 4096): IndexList {
  return { length: 0, values: new Uint32Array(capacity) };
}

export function appendIndex(out: IndexList, index: number): void {
  if (out.length === out.values.length) {
    const next = new Uint32Array(2 * out.values.length);
    next.set(out.values);
    out.values = next;
  }
  out.values[out.length++] = index;
}
