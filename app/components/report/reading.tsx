// The printed report's reading of a revision of any size: the drive rows and each rule with its
// reasons as groups in words, each defeating single fault with the rows it breaks and its
// disposition, and the changes since the compared revision.
import type { GroupsDocument } from "~/engine";
import type { Readable } from "~/reviews/readable";
import { groupLine, REASON_WORDS, type ConditionWords } from "~/reviews/group-words";
import { DISPOSITION_LABELS, faultKey, type Disposition } from "~/reviews/dispositions";
import type { Comparison } from "~/reviews/revision-view.server";
import { comparedWith, mentionsSingleFault, verdictChanges } from "~/components/review/changes-view";
import { SingleFaultResults } from "~/components/common-cause-note";
import { h2, iso } from "./paper";

const n = (x: number) => x.toLocaleString("en-US");

function Groups({ conditions, doc }: { conditions: ConditionWords[]; doc: GroupsDocument }) {
  if (doc.rows === 0) return <p className="text-ink-600">No rows.</p>;
  const more = doc.groupCount - doc.groups.length;
  return (
    <ul className="ml-4 list-disc">
      {doc.groups.map((g, i) => (
        <li key={i} className="break-inside-avoid">
          {groupLine(conditions, g)} <span className="text-ink-500">({n(g.rows)} rows)</span>
        </li>
      ))}
      {more > 0 ? <li className="list-none text-ink-600">…and {n(more)} more groups (in the CSV).</li> : null}
    </ul>
  );
}

export type ReportDisposition = { disposition: Disposition; justification: string; authorName: string; createdAt: string };

export function ReportReading({ readable, dispositions }: { readable: Readable; dispositions: Record<string, ReportDisposition> }) {
  const c = readable.conditions;
  return (
    <section aria-label="Row groups" data-testid="report-groups">
      <h2 className={h2}>What the table says, in groups</h2>
      <p className="mt-2">
        A group names the states some conditions must be in; every other condition may be in any state. Groups are disjoint and together are
        exactly the rows described.
      </p>
      <h3 className="mt-3 font-semibold">
        Drive runs in {n(readable.drive.rows)} of {n(readable.rows)} rows, in exactly {n(readable.drive.groupCount)} group
        {readable.drive.groupCount === 1 ? "" : "s"}
      </h3>
      <Groups conditions={c} doc={readable.drive} />
      <h2 className={h2}>Rules with their reasons</h2>
      {readable.rules.map((r) => (
        <div key={r.id} className="mt-3 break-inside-avoid" data-testid="report-rule">
          <h3 className="font-semibold">
            {r.holds ? "✓" : "✕"} {r.label} <code className="text-xs text-ink-500">{r.id}</code> — {r.holds ? "holds" : "fails"}
          </h3>
          {r.type === "inhibit" ? (
            <>
              <p>
                Forbids {r.forbids} in {n(r.unsafe.rows)} unsafe rows; {n(r.violating.rows)} violate it.
              </p>
              {r.violating.rows > 0 ? <Groups conditions={c} doc={r.violating} /> : null}
              {r.why?.reasons.map((p) => (
                <div key={p.reason} className="mt-1">
                  <p>
                    In {n(p.rows)} rows {REASON_WORDS[p.reason]} ({p.reason}):
                  </p>
                  <Groups
                    conditions={c}
                    doc={{ format: "chainproof/groups@1", set: p.reason, rows: p.rows, groups: p.groups, groupCount: p.groupCount }}
                  />
                </div>
              ))}
            </>
          ) : r.type === "require-drive" ? (
            <>
              <p>
                Demands drive in {n(r.demand.rows)} rows; {n(r.failing.rows)} do not drive.
              </p>
              <Groups conditions={c} doc={r.demand} />
            </>
          ) : (
            <p>
              {r.holds
                ? "No sequence of steps from power-up starts the drive on a throttle already held."
                : "A sequence of steps starts the drive on a held throttle (see the results)."}
            </p>
          )}
        </div>
      ))}
      <h2 className={h2}>Single faults and their dispositions</h2>
      <SingleFaultResults note="mt-2">
        {readable.faults.length === 0 ? <p className="mt-2">No single stuck contact defeats a rule.</p> : null}
        {readable.faults.map((f) => {
          const d = dispositions[faultKey(f)];
          return (
            <div key={faultKey(f)} className="mt-3 break-inside-avoid" data-testid="report-fault">
              <h3 className="font-semibold">
                {f.label} <code className="text-xs">{f.component}</code> {f.mode === "stuck-open" ? "stuck open" : "stuck closed"} — defeats{" "}
                {f.defeats.join(", ")}
              </h3>
              <p>Breaks {n(f.broken.rows)} rows:</p>
              <Groups conditions={c} doc={f.broken} />
              <p className="mt-1" data-testid="report-disposition">
                {d ? (
                  <>
                    <strong>{DISPOSITION_LABELS[d.disposition]}</strong>: {d.justification} — {d.authorName}, {iso(d.createdAt)}
                  </>
                ) : (
                  <strong>No disposition recorded.</strong>
                )}
              </p>
            </div>
          );
        })}
      </SingleFaultResults>
    </section>
  );
}

/** The verdict's differences; when single faults come or go, with the note on what such results do not cover. */
function VerdictLines({ lines }: { lines: string[] }) {
  const list = (
    <ul className="mt-2 ml-4 list-disc">
      {lines.map((v) => (
        <li key={v}>{v}</li>
      ))}
    </ul>
  );
  return lines.some(mentionsSingleFault) ? <SingleFaultResults>{list}</SingleFaultResults> : list;
}

export function ReportChanges({
  comparison,
  conditions,
  number,
}: {
  comparison: Comparison;
  conditions: ConditionWords[];
  number: number;
}) {
  if (comparison.baseline === null) {
    return (
      <section aria-label="Changes">
        <h2 className={h2}>Changes</h2>
        <p className="mt-2">This is the design's first revision.</p>
      </section>
    );
  }
  const s = comparison.structural;
  const items = [
    ...s.components.added.map((x) => `Component ${x} added`),
    ...s.components.removed.map((x) => `Component ${x} removed`),
    ...s.components.changed.flatMap((x) => x.values.map((v) => `Component ${x.id}, ${v.field}: ${v.before} → ${v.after}`)),
    ...s.wires.added.map((w) => `Wire ${w} added`),
    ...s.wires.removed.map((w) => `Wire ${w} removed`),
    ...s.conditions.added.map((x) => `Condition ${x} added`),
    ...s.conditions.removed.map((x) => `Condition ${x} removed`),
    ...s.conditions.changed.flatMap((x) => x.values.map((v) => `Condition ${x.id}, ${v.field}: ${v.before} → ${v.after}`)),
    ...s.rules.added.map((x) => `Rule ${x} added`),
    ...s.rules.removed.map((x) => `Rule ${x} removed`),
    ...s.rules.changed.flatMap((x) => x.values.map((v) => `Rule ${x.id}, ${v.field}: ${v.before} → ${v.after}`)),
    ...s.controllerValues.map((v) => `Controller ${v.field}: ${v.before} → ${v.after}`),
    ...(s.name ? [`Name: “${s.name.before}” → “${s.name.after}”`] : []),
  ];
  const o = comparison.outcomes;
  return (
    <section aria-label="Changes" data-testid="report-changes">
      <h2 className={h2}>
        {comparison.baseline.number < number ? "Changes since" : "Changes compared with"} revision {comparison.baseline.number}
      </h2>
      <p className="mt-2" data-testid="report-compared-with">
        {comparedWith(comparison.baseline)}
        {comparison.baseline.chosen ? " The reviewer chose this revision on the review page." : ""}
      </p>
      {items.length === 0 ? (
        <p className="mt-2">The structure is the same.</p>
      ) : (
        <ul className="mt-2 ml-4 list-disc break-words">
          {items.map((x, i) => (
            <li key={i}>{x}</li>
          ))}
        </ul>
      )}
      <VerdictLines lines={verdictChanges(comparison.verdict.before, comparison.verdict.after)} />
      {!o.comparable ? (
        <p className="mt-2">{o.reason}</p>
      ) : o.changedRows === 0 ? (
        <p className="mt-2">No row changed its drive or a rule's outcome.</p>
      ) : (
        <>
          <p className="mt-2">
            {n(o.changedRows)} rows of revision {number} changed their drive or a rule's outcome:
          </p>
          {o.changes.map((ch) => (
            <div key={`${ch.kind}:${ch.rule ?? ""}`} className="mt-1 break-inside-avoid">
              <p>
                {ch.kind}
                {ch.rule ? ` ${ch.rule}` : ""}: {n(ch.rows)} rows
              </p>
              <Groups
                conditions={conditions}
                doc={{ format: "chainproof/groups@1", set: ch.kind, rows: ch.rows, groups: ch.groups, groupCount: ch.groupCount }}
              />
            </div>
          ))}
        </>
      )}
    </section>
  );
}
