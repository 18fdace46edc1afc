// What a reviewer reads first, for a table of any size: the drive rows as a few groups in words, each
// rule with why it holds (or where it fails), and each single fault that defeats a rule with the rows
// it breaks and how it is dealt with. Every group links to the truth table filtered to its rows.
import type { ReactNode } from "react";
import { Form, Link, useNavigation } from "react-router";
import type { GroupsDocument, RowGroup } from "~/engine";
import type { FaultReading, Readable, RuleReading } from "~/reviews/readable";
import { groupSearch, groupWords, REASON_WORDS, type ConditionWords } from "~/reviews/group-words";
import { DISPOSITION_HINTS, DISPOSITION_LABELS, DISPOSITIONS, faultKey, type Disposition } from "~/reviews/dispositions";
import { Button, SelectField, TextArea } from "~/components/ui/form";
import { When } from "~/designs/design-bits";
import { Card, cardVariants } from "~/components/ui/card";
import { SingleFaultResults } from "~/components/common-cause-note";

const n = (x: number) => x.toLocaleString("en-US");
const plural = (x: number, one: string, many = `${one}s`) => `${n(x)} ${x === 1 ? one : many}`;

export function GroupItem({ conditions, group, tableHref }: { conditions: ConditionWords[]; group: RowGroup; tableHref: string }) {
  const w = groupWords(conditions, group);
  return (
    <li className="flex flex-wrap items-baseline gap-x-2 gap-y-1 py-1" data-testid="row-group">
      <span className="flex flex-wrap gap-1">
        {w.named.length === 0 ? <span className="text-ink-700">every row</span> : null}
        {w.named.map((x) => (
          <span key={x.id} className="rounded border border-ink-200 bg-white px-1.5 py-0.5 text-xs">
            <span className="text-ink-600">{x.label}</span> <strong className="font-semibold text-ink-900">{x.states.join(" or ")}</strong>
          </span>
        ))}
        {w.free.length > 0 && w.named.length > 0 ? (
          <span className="px-1 py-0.5 text-xs text-ink-500" title={`Any state of ${w.free.join(", ")}`}>
            {w.free.length <= 4 ? `any ${w.free.join(", ")}` : `any state of the ${w.free.length} other conditions`}
          </span>
        ) : null}
      </span>
      <Link
        to={tableHref}
        className="text-xs text-copper-700 underline"
        aria-label={`${plural(group.rows, "row")} of this group: open them`}
      >
        {plural(group.rows, "row")}
      </Link>
    </li>
  );
}

export function GroupList({
  conditions,
  doc,
  table,
  empty,
}: {
  conditions: ConditionWords[];
  doc: GroupsDocument;
  table: string;
  empty?: string;
}) {
  if (doc.rows === 0) return <p className="text-sm text-ink-600">{empty ?? "No rows."}</p>;
  const more = doc.groupCount - doc.groups.length;
  return (
    <>
      <ul className="divide-y divide-ink-100 text-sm">
        {doc.groups.map((g, i) => (
          <GroupItem key={i} conditions={conditions} group={g} tableHref={`${table}?${groupSearch(g)}`} />
        ))}
      </ul>
      {more > 0 ? (
        <p className="mt-1 text-xs text-ink-600">…and {plural(more, "more group")}: open the truth table to see every row.</p>
      ) : null}
    </>
  );
}

function RuleBlock({
  rule,
  conditions,
  table,
  ruleLabels,
}: {
  rule: RuleReading;
  conditions: ConditionWords[];
  table: string;
  ruleLabels: Record<string, string>;
}) {
  const head = (
    <h3 className="font-semibold">
      <span className={rule.holds ? "text-moss-700" : "text-brick-700"} aria-hidden="true">
        {rule.holds ? "✓ " : "✕ "}
      </span>
      {rule.label} <code className="text-xs font-normal text-ink-500">{rule.id}</code>
      <span className="ml-2 text-xs font-normal text-ink-600">{rule.holds ? "holds" : "fails"}</span>
    </h3>
  );
  if (rule.type === "no-restart") {
    return (
      <li className="py-3" data-testid="rule-reading">
        {head}
        <p className="mt-1 text-sm text-ink-700">
          {rule.holds
            ? "No sequence of steps from power-up starts the drive on a throttle already held."
            : "A sequence of steps starts the drive on a held throttle: its steps are under Verdict."}
        </p>
      </li>
    );
  }
  if (rule.type === "require-drive") {
    return (
      <li className="py-3" data-testid="rule-reading" data-rule={rule.id}>
        {head}
        <p className="mt-1 text-sm text-ink-700">
          Demands drive in {plural(rule.demand.rows, "row")}
          {rule.failing.rows === 0 ? ", and every one of them drives:" : `; ${plural(rule.failing.rows, "row does", "rows do")} not drive:`}
        </p>
        <div className="mt-1">
          <GroupList conditions={conditions} doc={rule.demand} table={table} />
        </div>
        {rule.failing.rows > 0 ? (
          <div className="mt-1 rounded border border-brick-200 bg-brick-50/50 px-2">
            <p className="pt-1 text-xs font-semibold text-brick-700">Demand rows without drive</p>
            <GroupList conditions={conditions} doc={rule.failing} table={table} />
          </div>
        ) : null}
      </li>
    );
  }
  const violating = rule.violating.rows;
  return (
    <li className="py-3" data-testid="rule-reading" data-rule={rule.id}>
      {head}
      <p className="mt-1 text-sm text-ink-700">
        Forbids {rule.forbids} in {plural(rule.unsafe.rows, "unsafe row")}
        {rule.unsafe.groupCount > 0 ? ` (${plural(rule.unsafe.groupCount, "group")})` : ""}.{" "}
        {violating === 0 ? "None of them violates it." : `${plural(violating, "row violates", "rows violate")} it:`}
      </p>
      {violating > 0 ? (
        <div className="mt-1 rounded border border-brick-200 bg-brick-50/50 px-2">
          <GroupList conditions={conditions} doc={rule.violating} table={table} />
        </div>
      ) : null}
      {rule.why && rule.why.reasons.length > 0 ? (
        <details className="mt-2" open={rule.why.reasons.length <= 3} data-testid="why">
          <summary className="cursor-pointer text-sm font-medium text-ink-800">
            Why {rule.holds ? "it holds" : "the other unsafe rows have no drive"}
          </summary>
          <ul className="mt-1 space-y-2">
            {rule.why.reasons.map((p) => (
              <li key={p.reason} data-testid="why-reason" data-reason={p.reason}>
                <p className="text-sm">
                  In {plural(p.rows, "row")} {REASON_WORDS[p.reason]}{" "}
                  <span className="text-xs text-ink-500">
                    ({p.reason}, {plural(p.groupCount, "group")})
                  </span>
                </p>
                <div className="ml-3">
                  <GroupList
                    conditions={conditions}
                    doc={{ format: "chainproof/groups@1", set: p.reason, rows: p.rows, groups: p.groups, groupCount: p.groupCount }}
                    table={table}
                  />
                </div>
              </li>
            ))}
          </ul>
        </details>
      ) : null}
      {rule.why === null && rule.unsafe.rows > 0 ? (
        <details className="mt-2">
          <summary className="cursor-pointer text-sm font-medium text-ink-800">Unsafe rows</summary>
          <GroupList conditions={conditions} doc={rule.unsafe} table={table} />
        </details>
      ) : null}
      <span className="sr-only">{ruleLabels[rule.id]}</span>
    </li>
  );
}

export type DispositionView = {
  component: string;
  mode: string;
  disposition: Disposition;
  justification: string;
  authorName: string;
  createdAt: string;
};

export function ReadableSummary({
  readable,
  table,
  ruleLabels,
  dispositions,
  canDispose,
  dispositionErrors,
}: {
  readable: Readable;
  table: string;
  ruleLabels: Record<string, string>;
  dispositions: Record<string, DispositionView>;
  canDispose: boolean;
  dispositionErrors: { key: string; errors: Record<string, string> } | null;
}) {
  const { conditions, drive } = readable;
  const open = readable.faults.filter((f) => !dispositions[faultKey(f)]).length;
  return (
    <>
      <Block
        title={`Drive runs in exactly ${drive.groupCount === 1 ? "this group" : `these ${n(drive.groupCount)} groups`}`}
        testId="drive-groups"
      >
        <p className="text-sm text-ink-700">
          {plural(drive.rows, "row")} of {n(readable.rows)} drive. Each group names the states it needs; “any” conditions may be in any
          state.
        </p>
        <GroupList
          conditions={conditions}
          doc={drive}
          table={table}
          empty="No row drives: this design can never drive, so its inhibit rules prove nothing."
        />
      </Block>
      <Block title="Rules: why each holds, what each demands" testId="rule-readings">
        <ul className="divide-y divide-ink-100">
          {readable.rules.map((r) => (
            <RuleBlock key={r.id} rule={r} conditions={conditions} table={table} ruleLabels={ruleLabels} />
          ))}
        </ul>
      </Block>
      <Block
        title={`Single faults that defeat a rule (${readable.faults.length})`}
        testId="fault-readings"
        aside={
          readable.faults.length > 0 ? (
            <span className={open > 0 ? "text-brick-700" : "text-moss-700"}>
              {open > 0 ? `${open} without a disposition` : "every fault has a disposition"}
            </span>
          ) : null
        }
      >
        <SingleFaultResults note="mt-3">
          {readable.faults.length === 0 ? (
            <p className="text-sm text-moss-700">No single stuck contact defeats a rule.</p>
          ) : (
            <ul className="space-y-4">
              {readable.faults.map((f) => (
                <FaultBlock
                  key={faultKey(f)}
                  fault={f}
                  conditions={conditions}
                  table={table}
                  ruleLabels={ruleLabels}
                  current={dispositions[faultKey(f)]}
                  canDispose={canDispose}
                  errors={dispositionErrors?.key === faultKey(f) ? dispositionErrors.errors : {}}
                />
              ))}
            </ul>
          )}
        </SingleFaultResults>
      </Block>
    </>
  );
}

function FaultBlock({
  fault,
  conditions,
  table,
  ruleLabels,
  current,
  canDispose,
  errors,
}: {
  fault: FaultReading;
  conditions: ConditionWords[];
  table: string;
  ruleLabels: Record<string, string>;
  current: DispositionView | undefined;
  canDispose: boolean;
  errors: Record<string, string>;
}) {
  const nav = useNavigation();
  const key = faultKey(fault);
  const busy =
    nav.state !== "idle" &&
    nav.formData?.get("intent") === "dispose" &&
    `${nav.formData.get("component")}/${nav.formData.get("mode")}` === key;
  const mode = fault.mode === "stuck-open" ? "stuck open" : "stuck closed";
  return (
    <Card as="li" padding="sm" data-testid="fault-reading" data-fault={key}>
      <h3 className="font-semibold">
        {fault.label} <code className="text-xs font-normal text-ink-500">{fault.component}</code> {mode}
      </h3>
      <p className="text-sm text-ink-700">
        Defeats {fault.defeats.map((r) => `${ruleLabels[r] ?? r} (${r})`).join(", ")}: with it, {plural(fault.broken.rows, "row")} would
        break {fault.defeats.length === 1 ? "that rule" : "those rules"}:
      </p>
      <GroupList conditions={conditions} doc={fault.broken} table={table} />
      <div className="mt-2 border-t border-ink-100 pt-2" data-testid="disposition">
        {current ? (
          <p className="text-sm">
            <strong className="text-ink-900">{DISPOSITION_LABELS[current.disposition]}</strong>: {current.justification}{" "}
            <span className="text-xs text-ink-500">
              — {current.authorName}, <When iso={current.createdAt} />
            </span>
          </p>
        ) : (
          <p className="text-sm font-semibold text-brick-700">
            No disposition yet: the revision cannot be approved until this fault has one.
          </p>
        )}
        {canDispose ? (
          <details className="mt-1" open={!current || Object.keys(errors).length > 0}>
            <summary className="cursor-pointer text-sm text-copper-700">
              {current ? "Record another disposition" : "Record a disposition"}
            </summary>
            <Form
              method="post"
              className="mt-2 grid gap-2 sm:grid-cols-[14rem_1fr_auto] sm:items-end"
              aria-label={`Disposition of ${fault.component} ${mode}`}
            >
              <input type="hidden" name="intent" value="dispose" />
              <input type="hidden" name="component" value={fault.component} />
              <input type="hidden" name="mode" value={fault.mode} />
              <SelectField
                id={`disposition-${key}`}
                label="Disposition"
                name="disposition"
                defaultValue={current?.disposition ?? ""}
                error={errors.disposition}
              >
                <option value="" disabled>
                  Choose…
                </option>
                {DISPOSITIONS.map((d) => (
                  <option key={d} value={d} title={DISPOSITION_HINTS[d]}>
                    {DISPOSITION_LABELS[d]}
                  </option>
                ))}
              </SelectField>
              <TextArea
                id={`justification-${key}`}
                label="Justification"
                name="justification"
                rows={2}
                required
                minLength={10}
                maxLength={2000}
                error={errors.justification ?? errors.component}
                hint={DISPOSITION_HINTS.accepted}
              />
              <Button type="submit" tone="secondary" disabled={busy}>
                {busy ? "Saving…" : "Save"}
              </Button>
            </Form>
          </details>
        ) : null}
      </div>
    </Card>
  );
}

function Block({ title, aside, testId, children }: { title: string; aside?: ReactNode; testId: string; children: ReactNode }) {
  return (
    <section className={cardVariants({ padding: "md" })} aria-label={title} data-testid={testId}>
      <div className="mb-2 flex flex-wrap items-baseline justify-between gap-2">
        <h2 className="text-base font-semibold">{title}</h2>
        {aside ? <span className="text-sm">{aside}</span> : null}
      </div>
      {children}
    </section>
  );
}
