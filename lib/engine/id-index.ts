/**
 * Id → position lookup for nodes and members. A Map costs several hundred nanoseconds per insertion at these
 * sizes (its table is regrown and copied as it fills), which for a 20,000-member model is more than all the
 * reference checks together; an open-addressing table sized once is several times cheaper. Lookups behave
 * like Map's: the last item with an id wins. Should ids ever hash badly (long probe runs, e.g. crafted input),
 * the index falls back to a Map, so the worst case stays Map's.
 */
export interface IdLookup {
  readonly size: number;
  get(id: string): number | undefined;
  has(id: string): boolean;
}

/** Probe run beyond which the table is abandoned for a Map. */
const MAX_PROBE = 48;

// A per-process seed keeps the hash from being predictable from outside.
const SEED = (Math.random() * 0x7fffffff) | 0;

function hashId(id: string): number {
  let h = SEED ^ 0x811c9dc5;
  for (let i = 0; i < id.length; i++) h = Math.imul(h ^ id.charCodeAt(i), 0x01000193);
  return h ^ (h >>> 15);
}

export class IdIndex implements IdLookup {
  readonly size: number;
  private readonly ids: string[];
  /** Item position + 1 per slot, 0 for empty. */
  private readonly slots: Int32Array;
  private readonly mask: number;
  private readonly fallback: Map<string, number> | null;

  /** `hash` is replaceable so tests can force collisions and the fallback. */
  constructor(
    items: ReadonlyArray<{ readonly id: string }>,
    private readonly hash: (id: string) => number = hashId,
  ) {
    const n = items.length;
    let capacity = 8;
    while (capacity < 2 * n) capacity *= 2;
    const slots = new Int32Array(capacity);
    const mask = capacity - 1;
    const ids: string[] = new Array(n);
    let distinct = 0;
    let fallback: Map<string, number> | null = null;
    for (let i = 0; i < n && !fallback; i++) {
      const id = items[i].id;
      ids[i] = id;
      let h = hash(id) & mask;
      for (let probe = 0; ; probe++) {
        const k = slots[h];
        if (k === 0) {
          slots[h] = i + 1;
          distinct++;
          break;
        }
        if (ids[k - 1] === id) {
          slots[h] = i + 1;
          break;
        }
        if (probe === MAX_PROBE) {
          fallback = new Map();
          for (let j = 0; j < n; j++) fallback.set(items[j].id, j);
          break;
        }
        h = (h + 1) & mask;
      }
    }
    this.ids = ids;
    this.slots = slots;
    this.mask = mask;
    this.fallback = fallback;
    this.size = fallback ? fallback.size : distinct;
  }

  get(id: string): number | undefined {
    if (this.fallback) return this.fallback.get(id);
    if (typeof id !== "string") return undefined;
    const { slots, ids, mask } = this;
    for (let h = this.hash(id) & mask; ; h = (h + 1) & mask) {
      const k = slots[h];
      if (k === 0) return undefined;
      if (ids[k - 1] === id) return k - 1;
    }
  }

  has(id: string): boolean {
    return this.get(id) !== undefined;
  }
}
