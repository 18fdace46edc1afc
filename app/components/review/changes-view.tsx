// What changed between two revisions of a design: every changed field with its value before and
// after, the verdict's differences, and the rows whose drive or rule outcome changed, as groups. A
// small form chooses both revisions: the one reviewed and the one to compare with (by default the last
// approved one).
import { Form } from "react-router";
import type { Verdict } from "~/engine";
import type { Comparison } from "~/reviews/revision-view.server";
import type { FieldChange, ListDiff } from "~/reviews/diff";
import { GroupList } from "./readable-summary";
import type { ConditionWords } from "~/reviews/group-words";
import { Button } from "~/components/ui/form";
import { SingleFaultResults } from "~/components/common-cause-note";

const n = (x: number) => x.toLocaleString("en-US");

function Values({ values }: { values: FieldChange[] }) {
  return (
    <ul className="ml-4 list-disc">
      {values.map((v) => (
        <li key={v.field}>
          {v.field}: <code className="rounded bg-brick-50 px-1 text-brick-700">{v.before}</code> →{" "}
          <code className="rounded bg-moss-50 px-1 text-moss-700">{v.after}</code>
        </li>
      ))}
    </ul>
  );
}

function ListChanges({ title, diff }: { title: string; diff: ListDiff }) {
  if (diff.added.length + diff.removed.length + diff.changed.length === 0) return null;
  return (
    <div>
      <h3 className="font-semibold">{title}</h3>
      <ul className="mt-1 space-y-0.5">
        {diff.added.map((id) => (
          <li key={`a${id}`}>
            <span className="font-mono text-moss-700">+ added</span> {id}
          </li>
        ))}
        {diff.removed.map((id) => (
          <li key={`r${id}`}>
            <span className="font-mono text-brick-700">− removed</span> {id}
          </li>
        ))}
        {diff.changed.map((c) => (
          <li key={`c${c.id}`}>
            <span className="font-mono text-copper-700">~ changed</span> {c.id}: {c.fields.join(", ")}
            <Values values={c.values} />
          </li>
        ))}
      </ul>
    </div>
  );
}

/** Which revision a comparison is with, and why that one: the review page and the report say it alike. */
export function comparedWith(baseline: { number: number; approved: boolean; chosen: boolean }): string {
  return `Compared with revision ${baseline.number}${
    baseline.chosen ? "." : baseline.approved ? ", the last approved one." : ", the previous one (no earlier revision is approved)."
  }`;
}

/** A line of verdictChanges about a single fault (it then needs the common-cause note beside it). */
export const mentionsSingleFault = (line: string) => /single fault/i.test(line);

/** The verdict's differences in words: ok, drive rows, each rule's result and counts, single faults. */
export function verdictChanges(before: Verdict, after: Verdict): string[] {
  const out: string[] = [];
  if (before.ok !== after.ok) out.push(`Every rule holds: ${before.ok ? "yes" : "no"} → ${after.ok ? "yes" : "no"}.`);
  if (before.driveRows !== after.driveRows) out.push(`Drive rows: ${n(before.driveRows)} → ${n(after.driveRows)}.`);
  if (before.rows !== after.rows) out.push(`Rows: ${n(before.rows)} → ${n(after.rows)}.`);
  const b = new Map(before.rules.map((r) => [r.id, r]));
  for (const r of after.rules) {
    const was = b.get(r.id);
    if (!was) {
      out.push(`Rule ${r.id} is new and ${r.holds ? "holds" : "fails"}.`);
      continue;
    }
    if (was.holds !== r.holds) out.push(`Rule ${r.id}: ${was.holds ? "held" : "failed"} → ${r.holds ? "holds" : "fails"}.`);
    const counts = (x: object) =>
      Object.entries(x)
        .filter(([k, v]) => typeof v === "number" && k.endsWith("Rows"))
        .map(([k, v]) => `${k} ${n(v as number)}`)
        .join(", ");
    if (counts(was) !== counts(r)) out.push(`Rule ${r.id}: ${counts(was)} → ${counts(r)}.`);
  }
  for (const r of before.rules) if (!after.rules.some((x) => x.id === r.id)) out.push(`Rule ${r.id} was removed.`);
  const key = (f: Verdict["singleFaults"][number]) => `${f.component} ${f.mode} (defeats ${f.defeats.join(", ")})`;
  const fb = new Set(before.singleFaults.map(key));
  const fa = new Set(after.singleFaults.map(key));
  for (const f of fa) if (!fb.has(f)) out.push(`New single fault: ${f}.`);
  for (const f of fb) if (!fa.has(f)) out.push(`Single fault gone: ${f}.`);
  return out;
}

function VerdictChangeList({ lines }: { lines: string[] }) {
  const list = (
    <ul className="mt-1 ml-4 list-disc" data-testid="verdict-changes">
      {lines.map((v) => (
        <li key={v}>{v}</li>
      ))}
    </ul>
  );
  return lines.some(mentionsSingleFault) ? <SingleFaultResults>{list}</SingleFaultResults> : list;
}

const CHANGE_WORDS = {
  "drive-on": "Drive now on",
  "drive-off": "Drive now off",
  "now-violating": "Now violate",
  "no-longer-violating": "No longer violate",
  "now-failing": "Now fail",
  "no-longer-failing": "No longer fail",
} as const;

export function ChangesView({
  comparison,
  number,
  others,
  conditions,
  table,
}: {
  comparison: Comparison;
  number: number;
  /** Other revision numbers of the design, to compare with. */
  others: number[];
  conditions: ConditionWords[];
  table: string;
}) {
  const all = [number, ...others].sort((a, b) => b - a);
  const select = "min-h-10 rounded-md border border-ink-300 bg-white px-2";
  // Both revisions are chosen here: another revision to review opens its own review page (the loader redirects).
  const chooser =
    others.length > 0 ? (
      <Form method="get" className="flex flex-wrap items-end gap-2 text-sm" aria-label="Compare two revisions">
        <label className="flex flex-col">
          <span className="text-ink-700">Review revision</span>
          <select name="revision" defaultValue={number} className={select}>
            {all.map((x) => (
              <option key={x} value={x}>
                {x}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col">
          <span className="text-ink-700">Compare with revision</span>
          <select name="compare" defaultValue={comparison.baseline?.number ?? ""} className={select}>
            {all.map((x) => (
              <option key={x} value={x}>
                {x}
              </option>
            ))}
          </select>
        </label>
        <Button type="submit" tone="secondary">
          Compare
        </Button>
      </Form>
    ) : null;
  if (comparison.baseline === null) {
    return (
      <div className="space-y-3">
        <p className="text-sm text-ink-600">
          This is the design's first revision, so there is nothing to compare with: review the whole design.
        </p>
        {chooser}
      </div>
    );
  }
  const { structural: s, outcomes } = comparison;
  const verdict = verdictChanges(comparison.verdict.before, comparison.verdict.after);
  return (
    <div className="space-y-4 text-sm" data-testid="review-diff">
      {chooser}
      <p data-testid="compared-with">
        {comparedWith(comparison.baseline)}
        {s.empty ? " The structure is the same." : ""}
      </p>
      {s.name ? (
        <p>
          Renamed from “{s.name.before}” to “{s.name.after}”.
        </p>
      ) : null}
      <ListChanges title="Components" diff={s.components} />
      {s.wires.added.length + s.wires.removed.length > 0 ? (
        <div>
          <h3 className="font-semibold">Wires</h3>
          <ul className="mt-1 space-y-0.5 font-mono text-xs">
            {s.wires.added.map((w) => (
              <li key={`a${w}`}>
                <span className="text-moss-700">+ added</span> {w}
              </li>
            ))}
            {s.wires.removed.map((w) => (
              <li key={`r${w}`}>
                <span className="text-brick-700">− removed</span> {w}
              </li>
            ))}
          </ul>
        </div>
      ) : null}
      <ListChanges title="Conditions" diff={s.conditions} />
      <ListChanges title="Rules" diff={s.rules} />
      {s.controllerValues.length > 0 ? (
        <div>
          <h3 className="font-semibold">Controller</h3>
          <Values values={s.controllerValues} />
        </div>
      ) : null}
      <div>
        <h3 className="font-semibold">Verdict</h3>
        {verdict.length === 0 ? <p className="mt-1 text-ink-700">The verdict is the same.</p> : <VerdictChangeList lines={verdict} />}
      </div>
      <div>
        <h3 className="font-semibold">Truth-table rows</h3>
        {!outcomes.comparable ? (
          <p className="mt-1 text-ink-700">{outcomes.reason}</p>
        ) : outcomes.changedRows === 0 ? (
          <p className="mt-1 text-moss-700">No row changed its drive or the rules it violates ({n(outcomes.rows)} rows compared).</p>
        ) : (
          <>
            <p className="mt-1">
              {n(outcomes.changedRows)} of {n(outcomes.rows)} rows changed their drive or a rule's outcome (revision {number}'s rows, as
              groups):
            </p>
            <ul className="mt-2 space-y-2" data-testid="row-changes">
              {outcomes.changes.map((ch) => (
                <li key={`${ch.kind}:${ch.rule ?? ""}`}>
                  <p className="font-medium">
                    {CHANGE_WORDS[ch.kind]}
                    {ch.rule ? ` ${ch.rule}` : ""}: {n(ch.rows)} rows
                  </p>
                  <div className="ml-3">
                    <GroupList
                      conditions={conditions}
                      doc={{ format: "chainproof/groups@1", set: ch.kind, rows: ch.rows, groups: ch.groups, groupCount: ch.groupCount }}
                      table={table}
                    />
                  </div>
                </li>
              ))}
            </ul>
          </>
        )}
      </div>
    </div>
  );
}
