// Element ids to positions, for the hot path of large networks: an open-addressing hash table on
// typed arrays, about twice as fast to build and search as a Map with 100,000 string keys.
// Ids are unique in a validated network; should one repeat, its first position wins.
import type { Network } from "#solver/schema.ts";

export class IdIndex {
  private readonly table: Int32Array;
  private readonly mask: number;
  /** Each position whose id appeared earlier, with that first position: [position, first] pairs, in order. */
  readonly repeats: number[] = [];

  constructor(private readonly ids: readonly string[]) {
    let size = 16;
    while (size < ids.length * 2) size *= 2;
    this.table = new Int32Array(size).fill(-1);
    this.mask = size - 1;
    for (let i = 0; i < ids.length; i++) {
      let slot = hashOf(ids[i]) & this.mask;
      for (;;) {
        const taken = this.table[slot];
        if (taken === -1) {
          this.table[slot] = i;
          break;
        }
        if (ids[taken] === ids[i]) {
          this.repeats.push(i, taken);
          break;
        }
        slot = (slot + 1) & this.mask;
      }
    }
  }

  /** Position of the id, or undefined when it is not there. */
  get(id: string): number | undefined {
    let slot = hashOf(id) & this.mask;
    for (;;) {
      const at = this.table[slot];
      if (at === -1) return undefined;
      if (this.ids[at] === id) return at;
      slot = (slot + 1) & this.mask;
    }
  }
}

/** FNV-1a over the UTF-16 code units. */
function hashOf(text: string): number {
  let hash = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) hash = Math.imul(hash ^ text.charCodeAt(i), 0x01000193);
  return hash;
}

const busIndexes = new WeakMap<Network, IdIndex>();

/** The buses' positions by id, built once per network and shared by the load flow, the faults and the checks. */
export function busIndexOf(network: Network): IdIndex {
  let index = busIndexes.get(network);
  if (!index) {
    index = new IdIndex(network.buses.map((bus) => bus.id));
    busIndexes.set(network, index);
  }
  return index;
}
