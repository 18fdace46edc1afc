// Single faults (spec 1.7): for each contact stuck open or stuck closed, which inhibit rules that
// hold fault-free fail with the fault. It rides along the fault-free scan (see rules.ts): the
// fault-free word is evaluated once, and the nets are re-settled only for faults that can change a
// row where one of their still-undecided rules is unsafe.
import type { CompiledDesign } from "./compile";
import type { FaultMode, SingleFault } from "./schema";
import type { WordEvaluator } from "./table";

const CLOSED = 0;
const OPEN = 1;

export class FaultTracker {
  private readonly c: CompiledDesign;
  private readonly ev: WordEvaluator;
  private readonly jobContact: Int32Array;
  private readonly jobPosition: Int32Array;
  private readonly jobA: Int32Array;
  private readonly jobB: Int32Array;
  private readonly jobMode: Int32Array;
  /** Group of each job: jobs with the same undecided rules share a group. */
  private readonly jobGroup: Int32Array;
  private readonly defeated: number[][];
  private readonly groupRules: number[][] = [];
  private readonly groupOf = new Map<string, number>();
  private groupRelevant = new Int32Array(8);
  /** Rules still holding fault-free so far (a rule that fails fault-free cannot be defeated). */
  private readonly alive: Uint8Array;
  private active: Int32Array;
  private activeCount: number;
  private dirty = false;
  private readonly faulted: Int32Array;
  /** Tree wiring only: per job, the flow positions below the contact, and its parallel twins. */
  private readonly below: Int32Array[] = [];
  private readonly twins: Int32Array[] = [];
  private readonly flowC: Int32Array;
  private readonly flowNear: Int32Array;
  private readonly flowFar: Int32Array;
  /** General wiring only: per job, the nets its fault can change. */
  private readonly clear: Int32Array[] = [];

  constructor(c: CompiledDesign, ev: WordEvaluator) {
    this.c = c;
    this.ev = ev;
    this.alive = new Uint8Array(c.rules.length);
    const inhibit = c.rules.filter((r) => r.type === "inhibit");
    for (const r of inhibit) this.alive[r.index] = 1;
    const jobs: Array<[number, number, number]> = [];
    const groups: number[] = [];
    this.flowC = Int32Array.from(c.flow.map((f) => f.contact));
    this.flowNear = Int32Array.from(c.flow.map((f) => f.near));
    this.flowFar = Int32Array.from(c.flow.map((f) => f.far));
    const inputNet = (fn: keyof CompiledDesign["inputOf"]) => (c.inputOf[fn] < 0 ? -1 : c.inputs[c.inputOf[fn]].net);
    const allFlowNets = new Set(c.flow.flatMap((f) => [f.near, f.far]));
    const blocks = c.singlePass ? { affected: [] } : blocksBelow(c);
    // A contact that can never carry supply current cannot change anything.
    c.flow.forEach((f, p) => {
      // Nets whose energizing the fault can change: in tree wiring the nets below the contact.
      let affected = allFlowNets;
      let below: number[] = [];
      let twins: number[] = [];
      if (!c.singlePass) {
        // The contact's block and everything hanging below it; the block's root net keeps its energy.
        affected = blocks.affected[p];
        below = c.flow.flatMap((g, q) => (affected.has(g.near) || affected.has(g.far) ? [q] : []));
      } else {
        affected = new Set([f.far]);
        c.flow.forEach((g, q) => {
          if (q > p && affected.has(g.near)) {
            affected.add(g.far);
            below.push(q);
          }
        });
        // Parallel twins: other contacts between the same two nets (all supplies count as one).
        const sameNear = (x: number, y: number) => x === y || (c.supplyNets.includes(x) && c.supplyNets.includes(y));
        twins = c.flow.flatMap((g, q) => (q !== p && sameNear(g.near, f.near) && g.far === f.far ? [q] : []));
      }
      const touches = (...fns: Array<keyof CompiledDesign["inputOf"]>) => fns.some((fn) => affected.has(inputNet(fn)));
      for (const mode of [CLOSED, OPEN]) {
        const rules = inhibit
          .filter((r) => {
            if (r.type !== "inhibit") return false;
            // Energizing is monotone in conduction: only a contact stuck closed can energize an input,
            // and only one upstream of it.
            if (r.forbidInput >= 0) return mode === CLOSED && affected.has(c.inputs[r.forbidInput].net);
            // Drive turns on only if power, enable or a direction gains energy (stuck closed), or if
            // the brake or a direction loses it (stuck open).
            return mode === CLOSED ? touches("power", "enable", "forward", "reverse") : touches("brake", "forward", "reverse");
          })
          .map((r) => r.index);
        if (rules.length === 0) continue;
        jobs.push([f.contact, mode, p]);
        groups.push(this.group(rules));
        this.below.push(Int32Array.from(below));
        this.twins.push(Int32Array.from(twins));
        this.clear.push(Int32Array.from(c.singlePass ? [] : affected));
      }
    });
    this.jobContact = Int32Array.from(jobs.map((j) => j[0]));
    this.jobPosition = Int32Array.from(jobs.map((j) => j[2]));
    this.jobMode = Int32Array.from(jobs.map((j) => j[1]));
    this.jobA = Int32Array.from(jobs.map((j) => c.contacts[j[0]].netA));
    this.jobB = Int32Array.from(jobs.map((j) => c.contacts[j[0]].netB));
    this.jobGroup = Int32Array.from(groups);
    this.defeated = jobs.map(() => []);
    this.active = Int32Array.from(jobs.map((_, i) => i));
    this.activeCount = jobs.length;
    this.faulted = new Int32Array(c.nets.length);
  }

  private group(rules: number[]): number {
    const key = rules.join(",");
    let g = this.groupOf.get(key);
    if (g === undefined) {
      g = this.groupRules.length;
      this.groupRules.push(rules);
      this.groupOf.set(key, g);
      if (g >= this.groupRelevant.length) {
        const grown = new Int32Array(this.groupRelevant.length * 2);
        grown.set(this.groupRelevant);
        this.groupRelevant = grown;
      }
    }
    return g;
  }

  /** No fault can defeat a rule that fails fault-free. */
  ruleFails(r: number): void {
    if (this.alive[r]) {
      this.alive[r] = 0;
      this.dirty = true;
    }
  }

  get done(): boolean {
    return this.activeCount === 0;
  }

  /** Checks every active fault on the evaluator's current word; `unsafe[r]` is rule r's unsafe word. */
  word(unsafe: Int32Array): void {
    const groups = this.groupRules;
    const rel = this.groupRelevant;
    const alive = this.alive;
    for (let g = 0; g < groups.length; g++) {
      const rules = groups[g];
      let m = 0;
      for (let k = 0; k < rules.length; k++) if (alive[rules[k]]) m |= unsafe[rules[k]];
      rel[g] = m;
    }
    const cw = this.ev.cw;
    const reach = this.ev.reach;
    const active = this.active;
    for (let n = 0; n < this.activeCount; n++) {
      const j = active[n];
      const relevant = rel[this.jobGroup[j]];
      if (relevant === 0) continue;
      const k = this.jobContact[j];
      // Rows the fault can change: closing an open contact between a live and a dead net, or
      // opening a closed contact that carries current.
      const changed =
        this.jobMode[j] === CLOSED
          ? ~cw[k] & (reach[this.jobA[j]] ^ reach[this.jobB[j]]) & relevant
          : cw[k] & reach[this.jobA[j]] & relevant;
      if (changed !== 0) this.check(j, unsafe);
    }
    if (this.dirty) this.compact();
  }

  private check(j: number, unsafe: Int32Array): void {
    const ev = this.ev;
    const k = this.jobContact[j];
    const closed = this.jobMode[j] === CLOSED;
    const faulted = this.faulted;
    faulted.set(ev.reach);
    if (this.c.singlePass) this.settleBelow(j, closed);
    else this.settleBlock(j, k, closed);
    const drive = ev.driveFrom(faulted);
    const rules = this.groupRules[this.jobGroup[j]];
    let left: number[] | null = null;
    for (let n = 0; n < rules.length; n++) {
      const r = rules[n];
      if (this.alive[r] && (unsafe[r] & ev.forbiddenWord(r, faulted, drive)) !== 0) {
        this.defeated[j].push(r);
        left = (left ?? rules).filter((x) => x !== r);
      }
    }
    if (left) {
      this.jobGroup[j] = this.group(left);
      this.dirty = true;
    }
  }

  /**
   * Tree wiring: only the nets below the faulted contact change. Stuck closed, the far net takes
   * the near net's energy; stuck open, it keeps only what parallel twins bring; then the energy is
   * pushed down the subtree.
   */
  private settleBelow(j: number, closed: boolean): void {
    const f = this.faulted;
    const cw = this.ev.cw;
    const p = this.jobPosition[j];
    const far = this.flowFar[p];
    const below = this.below[j];
    if (closed) {
      f[far] |= f[this.flowNear[p]];
    } else {
      for (let n = 0; n < below.length; n++) f[this.flowFar[below[n]]] = 0;
      let w = 0;
      const twins = this.twins[j];
      for (let n = 0; n < twins.length; n++) w |= f[this.flowNear[twins[n]]] & cw[this.flowC[twins[n]]];
      f[far] = w;
    }
    for (let n = 0; n < below.length; n++) {
      const q = below[n];
      f[this.flowFar[q]] |= f[this.flowNear[q]] & cw[this.flowC[q]];
    }
  }

  /**
   * General wiring: only the faulted contact's block and what hangs below it change. Those nets are
   * cleared (stuck open) or kept (stuck closed, energy only grows), then settled over their contacts.
   */
  private settleBlock(j: number, k: number, closed: boolean): void {
    const f = this.faulted;
    const cw = this.ev.cw;
    const entries = this.below[j];
    const near = this.flowNear;
    const far = this.flowFar;
    const fc = this.flowC;
    if (!closed) {
      const clear = this.clear[j];
      for (let n = 0; n < clear.length; n++) f[clear[n]] = 0;
    }
    const saved = cw[k];
    cw[k] = closed ? -1 : 0;
    let changed = true;
    while (changed) {
      changed = false;
      for (let n = 0; n < entries.length; n++) {
        const q = entries[n];
        const a = near[q];
        const b = far[q];
        const ra = f[a];
        const rb = f[b];
        const t = (ra | rb) & cw[fc[q]];
        if ((t & ~ra) | (t & ~rb)) {
          f[a] = ra | t;
          f[b] = rb | t;
          changed = true;
        }
      }
    }
    cw[k] = saved;
  }

  /** Drops faults with no undecided rule left. */
  private compact(): void {
    this.dirty = false;
    let m = 0;
    for (let n = 0; n < this.activeCount; n++) {
      const j = this.active[n];
      if (this.groupRules[this.jobGroup[j]].some((r) => this.alive[r])) this.active[m++] = j;
    }
    this.activeCount = m;
  }

  /** The faults that defeat at least one rule holding fault-free, in verdict order. */
  result(holds: (r: number) => boolean): SingleFault[] {
    const c = this.c;
    const out: Array<SingleFault & { order: number }> = [];
    for (let j = 0; j < this.jobContact.length; j++) {
      const defeats = this.defeated[j].filter(holds).sort((x, y) => x - y);
      if (defeats.length === 0) continue;
      const mode: FaultMode = this.jobMode[j] === CLOSED ? "stuck-closed" : "stuck-open";
      out.push({ component: c.contacts[this.jobContact[j]].id, mode, defeats: defeats.map((r) => c.rules[r].id), order: 0 });
    }
    out.sort((a, b) =>
      a.component < b.component ? -1 : a.component > b.component ? 1 : a.mode === b.mode ? 0 : a.mode === "stuck-closed" ? -1 : 1,
    );
    return out.map(({ component, mode, defeats }) => ({ component, mode, defeats }));
  }
}

/**
 * For each flow contact, the nets whose energizing a fault of that contact can change: the nets of
 * its biconnected block other than the block's root (the cut vertex towards the supplies), and
 * every net in blocks further from the supplies. Supplies are merged into one source vertex.
 */
function blocksBelow(c: CompiledDesign): { affected: Set<number>[] } {
  const SOURCE = c.nets.length;
  const isSupply = new Set(c.supplyNets);
  const node = (net: number) => (isSupply.has(net) ? SOURCE : net);
  const adj = new Map<number, Array<[number, number]>>();
  c.flow.forEach((f, p) => {
    const a = node(f.near);
    const b = node(f.far);
    (adj.get(a) ?? adj.set(a, []).get(a)!).push([b, p]);
    (adj.get(b) ?? adj.set(b, []).get(b)!).push([a, p]);
  });
  // Tarjan's biconnected components, iterative, from the source.
  const disc = new Map<number, number>();
  const low = new Map<number, number>();
  const blockOf = new Int32Array(c.flow.length).fill(-1);
  const blockRoot: number[] = [];
  const blockParent: number[] = [];
  const blockOfVertexBelow = new Map<number, number>(); // vertex -> block where it is not the root
  const edgeStack: number[] = [];
  let time = 0;
  type Frame = { v: number; viaEdge: number; i: number };
  disc.set(SOURCE, time);
  low.set(SOURCE, time++);
  const stack: Frame[] = [{ v: SOURCE, viaEdge: -1, i: 0 }];
  while (stack.length > 0) {
    const top = stack[stack.length - 1];
    const edges = adj.get(top.v) ?? [];
    if (top.i < edges.length) {
      const [u, p] = edges[top.i++];
      if (p === top.viaEdge) continue;
      if (!disc.has(u)) {
        edgeStack.push(p);
        disc.set(u, time);
        low.set(u, time++);
        stack.push({ v: u, viaEdge: p, i: 0 });
      } else if (disc.get(u)! < disc.get(top.v)!) {
        edgeStack.push(p);
        low.set(top.v, Math.min(low.get(top.v)!, disc.get(u)!));
      }
      continue;
    }
    stack.pop();
    if (stack.length === 0) break;
    const parent = stack[stack.length - 1];
    low.set(parent.v, Math.min(low.get(parent.v)!, low.get(top.v)!));
    if (low.get(top.v)! >= disc.get(parent.v)!) {
      const b = blockRoot.length;
      blockRoot.push(parent.v);
      blockParent.push(blockOfVertexBelow.get(parent.v) ?? -1);
      for (;;) {
        const p = edgeStack.pop()!;
        blockOf[p] = b;
        for (const x of [node(c.flow[p].near), node(c.flow[p].far)]) {
          if (x !== parent.v && !blockOfVertexBelow.has(x)) blockOfVertexBelow.set(x, b);
        }
        if (p === top.viaEdge) break;
      }
    }
  }
  // Blocks are found children first, so a block's parent is not known when it is popped; resolve
  // ancestry through the vertex map instead: block B lies below block A if B's root is below A.
  const verticesBelow: Set<number>[] = blockRoot.map(() => new Set());
  for (const [v, b] of blockOfVertexBelow) verticesBelow[b].add(v);
  const ancestors = (b: number): number[] => {
    const out: number[] = [];
    for (let x = blockOfVertexBelow.get(blockRoot[b]); x !== undefined; x = blockOfVertexBelow.get(blockRoot[x])) out.push(x);
    return out;
  };
  const subtree: Set<number>[] = blockRoot.map(() => new Set());
  blockRoot.forEach((_, b) => {
    for (const v of verticesBelow[b]) subtree[b].add(v);
    for (const a of ancestors(b)) for (const v of verticesBelow[b]) subtree[a].add(v);
  });
  void blockParent;
  // Map source-merged vertices back to nets (the source is never affected).
  return { affected: c.flow.map((_, p) => new Set([...subtree[blockOf[p]]].filter((v) => v !== SOURCE))) };
}
