// A set of truth-table rows as a reduced ordered decision diagram (one level per condition in design
// order, one arc per state), built bottom-up from the set's bitmap, and read back as row groups: one
// group per path to "in the set", the arcs of a node that reach the same child merged into one state
// subset (spec section 4). That is exactly the spec's baseline, so the groups never outnumber it.
import type { CompiledDesign } from "./compile";
import { popcount } from "./table";

/** A group of rows: condition index -> bit mask of its allowed states (absent: any state). */
export type MaskGroup = { rows: number; masks: Map<number, number> };

const FALSE = 0;
const TRUE = 1;

/**
 * Nodes of a reduced diagram: 0 is "not in the set", 1 "in the set"; every other node has a level
 * (condition index) and one child per state of that condition, never all the same, and no two nodes
 * have the same level and children (hash-consed).
 */
export class RowDiagram {
  private nodeLevel = new Int32Array(1024);
  private nodeStart = new Int32Array(1024);
  private kids = new Int32Array(4096);
  private kidsUsed = 0;
  private count = 2;
  private table = new Int32Array(2048).fill(-1);
  root = FALSE;

  constructor(readonly c: CompiledDesign) {}

  get nodes(): number {
    return this.count;
  }

  level(node: number): number {
    return node < 2 ? this.c.conditions.length : this.nodeLevel[node];
  }

  child(node: number, state: number): number {
    return this.kids[this.nodeStart[node] + state];
  }

  /** The node for `level` with children `from[at .. at + radix)`, reduced and shared. */
  make(level: number, from: ArrayLike<number>, at: number): number {
    const radix = this.c.conditions[level].radix;
    const first = from[at];
    let same = true;
    let h = Math.imul(level + 1, 0x9e3779b1);
    for (let k = 0; k < radix; k++) {
      const x = from[at + k];
      if (x !== first) same = false;
      h = Math.imul(h ^ x, 0x85ebca6b) ^ (h >>> 13);
    }
    if (same) return first;
    const mask = this.table.length - 1;
    for (let slot = h & mask; ; slot = (slot + 1) & mask) {
      const n = this.table[slot];
      if (n < 0) {
        const made = this.add(level, from, at, radix);
        this.table[slot] = made;
        if (this.count * 2 > this.table.length) this.rehash();
        return made;
      }
      if (this.nodeLevel[n] !== level) continue;
      const s = this.nodeStart[n];
      let equal = true;
      for (let k = 0; k < radix; k++) {
        if (this.kids[s + k] !== from[at + k]) {
          equal = false;
          break;
        }
      }
      if (equal) return n;
    }
  }

  private add(level: number, from: ArrayLike<number>, at: number, radix: number): number {
    if (this.count === this.nodeLevel.length) {
      this.nodeLevel = grow(this.nodeLevel, this.count * 2);
      this.nodeStart = grow(this.nodeStart, this.count * 2);
    }
    if (this.kidsUsed + radix > this.kids.length) this.kids = grow(this.kids, (this.kidsUsed + radix) * 2);
    const n = this.count++;
    this.nodeLevel[n] = level;
    this.nodeStart[n] = this.kidsUsed;
    for (let k = 0; k < radix; k++) this.kids[this.kidsUsed++] = from[at + k];
    return n;
  }

  private rehash(): void {
    const table = new Int32Array(this.table.length * 2).fill(-1);
    const mask = table.length - 1;
    for (let n = 2; n < this.count; n++) {
      const level = this.nodeLevel[n];
      const radix = this.c.conditions[level].radix;
      const s = this.nodeStart[n];
      let h = Math.imul(level + 1, 0x9e3779b1);
      for (let k = 0; k < radix; k++) h = Math.imul(h ^ this.kids[s + k], 0x85ebca6b) ^ (h >>> 13);
      let slot = h & mask;
      while (table[slot] >= 0) slot = (slot + 1) & mask;
      table[slot] = n;
    }
    this.table = table;
  }
}

function grow(a: Int32Array<ArrayBuffer>, size: number): Int32Array<ArrayBuffer> {
  const b = new Int32Array(size);
  b.set(a);
  return b;
}

/**
 * Builds the reduced diagram of the rows whose bits are set in `bits` (bit j of word w is row
 * 32*w + j; bits past the last row must be clear). The deepest conditions whose rows fit in one
 * 32-bit pattern are read as patterns (each distinct pattern built once), the levels above as arrays
 * of child nodes, one level at a time.
 */
export function buildDiagram(c: CompiledDesign, bits: Int32Array): RowDiagram {
  const d = new RowDiagram(c);
  const conds = c.conditions;
  const n = conds.length;
  // Cut: conditions cut..n-1 span `block` rows (<= 32); block = stride of condition cut-1.
  let cut = n;
  let block = 1;
  while (cut > 0 && block * conds[cut - 1].radix <= 32) block *= conds[--cut].radix;

  const fromPattern = new Map<number, number>();
  const patternNode = (level: number, pattern: number, width: number): number => {
    if (pattern === 0) return FALSE;
    if (width === 32 ? pattern === -1 : pattern === (1 << width) - 1) return TRUE;
    const { radix, stride } = conds[level];
    const low = (1 << stride) - 1; // stride < width <= 32, so stride <= 16
    const kids = new Int32Array(radix);
    for (let k = 0; k < radix; k++) kids[k] = patternNode(level + 1, (pattern >>> (k * stride)) & low, stride);
    return d.make(level, kids, 0);
  };

  const blocks = c.rows / block;
  let ids = new Int32Array(blocks);
  const full = block === 32 ? -1 : (1 << block) - 1;
  for (let b = 0, start = 0; b < blocks; b++, start += block) {
    const w = start >>> 5;
    const off = start & 31;
    let p = bits[w] >>> off;
    if (off + block > 32) p |= bits[w + 1] << (32 - off);
    p &= full;
    if (p === 0) {
      ids[b] = FALSE;
      continue;
    }
    let node = fromPattern.get(p);
    if (node === undefined) {
      node = patternNode(cut, p, block);
      fromPattern.set(p, node);
    }
    ids[b] = node;
  }
  for (let level = cut - 1; level >= 0; level--) {
    const radix = conds[level].radix;
    const next = new Int32Array(ids.length / radix);
    for (let b = 0, at = 0; b < next.length; b++, at += radix) next[b] = d.make(level, ids, at);
    ids = next;
  }
  d.root = ids[0];
  return d;
}

/** Number of groups (paths to "in the set", same-child arcs merged) below each node, memoized. */
function pathCounts(d: RowDiagram): (node: number) => number {
  const memo = new Map<number, number>([
    [FALSE, 0],
    [TRUE, 1],
  ]);
  const count = (node: number): number => {
    const hit = memo.get(node);
    if (hit !== undefined) return hit;
    const radix = d.c.conditions[d.level(node)].radix;
    const seen = new Set<number>();
    let total = 0;
    for (let k = 0; k < radix; k++) {
      const kid = d.child(node, k);
      if (seen.has(kid)) continue;
      seen.add(kid);
      total += count(kid);
    }
    memo.set(node, total);
    return total;
  };
  return count;
}

/**
 * The groups of the diagram in a fixed order (depth first, states in condition order), at most
 * `limit`, with the total number of groups.
 */
export function diagramGroups(d: RowDiagram, limit = Infinity): { groups: MaskGroup[]; groupCount: number } {
  const conds = d.c.conditions;
  const groupCount = pathCounts(d)(d.root);
  const groups: MaskGroup[] = [];
  const path: Array<[number, number]> = [];
  const walk = (node: number): void => {
    if (groups.length >= limit || node === FALSE) return;
    if (node === TRUE) {
      let rows = d.c.rows;
      const masks = new Map<number, number>();
      for (const [level, mask] of path) {
        rows = (rows / conds[level].radix) * popcount(mask);
        masks.set(level, mask);
      }
      groups.push({ rows, masks });
      return;
    }
    const level = d.level(node);
    const radix = conds[level].radix;
    const order: number[] = [];
    const maskOf = new Map<number, number>();
    for (let k = 0; k < radix; k++) {
      const kid = d.child(node, k);
      const m = maskOf.get(kid);
      if (m === undefined) order.push(kid);
      maskOf.set(kid, (m ?? 0) | (1 << k));
    }
    for (const kid of order) {
      if (kid === FALSE) continue;
      path.push([level, maskOf.get(kid)!]);
      walk(kid);
      path.pop();
    }
  };
  walk(d.root);
  return { groups, groupCount };
}
