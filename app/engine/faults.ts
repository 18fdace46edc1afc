// Single faults (spec 1.7): for each contact stuck open or stuck closed, which inhibit rules that
// hold fault-free fail with the fault. One scan of the table evaluates the fault-free word once and
// re-settles the nets only for faults that can change a row where a still-undecided rule is unsafe.
import type { CompiledDesign } from "./compile";
import type { FaultMode, SingleFault } from "./schema";
import { WordEvaluator } from "./table";

type FaultJob = {
  contact: number;
  mode: FaultMode;
  /** Rule indexes that hold fault-free and are not yet defeated by this fault. */
  pending: number[];
  defeated: number[];
};

/** Returns the faults that defeat at least one of `holding` (inhibit rule indexes), in verdict order. */
export function singleFaults(c: CompiledDesign, holding: number[]): SingleFault[] {
  const ev = new WordEvaluator(c);
  const jobs: FaultJob[] = [];
  const inFlow = new Set(c.flow.map((f) => f.contact));
  const order = c.contacts.map((_, i) => i).sort((a, b) => (c.contacts[a].id < c.contacts[b].id ? -1 : 1));
  for (const i of order) {
    for (const mode of ["stuck-closed", "stuck-open"] as const) {
      // A contact that can never carry supply current cannot change anything.
      if (!inFlow.has(i)) continue;
      // Energizing is monotone in contact conduction: opening a contact never energizes an input.
      const pending = holding.filter((r) => {
        const rule = c.rules[r];
        return !(mode === "stuck-open" && rule.type === "inhibit" && rule.forbidInput >= 0);
      });
      if (pending.length > 0) jobs.push({ contact: i, mode, pending, defeated: [] });
    }
  }

  const unsafe = new Int32Array(c.rules.length);
  const faulted = new Int32Array(c.nets.length);
  const cw = ev.cw;
  const reach = ev.reach;
  let active = jobs.slice();
  for (let w = 0; w < ev.wordCount && active.length > 0; w++) {
    ev.evalWord(w);
    let anyUnsafe = 0;
    for (const r of holding) anyUnsafe |= unsafe[r] = ev.unsafeWord(r);
    if (anyUnsafe === 0) continue;
    let finished = false;
    for (const job of active) {
      let relevant = 0;
      for (const r of job.pending) relevant |= unsafe[r];
      if (relevant === 0) continue;
      const k = job.contact;
      const a = c.contacts[k].netA;
      const b = c.contacts[k].netB;
      const saved = cw[k];
      // Rows the fault can change: closing an open contact between an energized and a dead net,
      // or opening a closed contact that carries current.
      const changed =
        job.mode === "stuck-closed" ? ~saved & (reach[a] ^ reach[b]) & relevant : saved & reach[a] & relevant;
      if (changed === 0) continue;
      faulted.set(reach);
      cw[k] = job.mode === "stuck-closed" ? -1 : 0;
      ev.settle(faulted, job.mode === "stuck-closed");
      cw[k] = saved;
      const drive = ev.driveFrom(faulted);
      for (let n = job.pending.length - 1; n >= 0; n--) {
        const r = job.pending[n];
        if ((unsafe[r] & ev.forbiddenWord(r, faulted, drive)) !== 0) {
          job.defeated.push(r);
          job.pending.splice(n, 1);
        }
      }
      if (job.pending.length === 0) finished = true;
    }
    if (finished) active = active.filter((j) => j.pending.length > 0);
  }

  return jobs
    .filter((j) => j.defeated.length > 0)
    .map((j) => ({
      component: c.contacts[j.contact].id,
      mode: j.mode,
      defeats: j.defeated.sort((x, y) => x - y).map((r) => c.rules[r].id),
    }));
}
