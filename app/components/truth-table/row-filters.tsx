// The truth table's filter box: which rows (unsafe, violating, drive, must-drive demand or failing) and
// for which rule, conditions fixed to a state, and a jump to one row of the whole table. The page owns
// the query (it lives in the URL) and what a jump does; this box owns what is being typed.
import { useState, type FormEvent } from "react";
import { ONLY, type FilterQuery, type Only, type TableColumns } from "~/reviews/truth-table";
import { Button } from "~/components/ui/button";
import { Card } from "~/components/ui/card";

const selectClass =
  "mt-1 block w-full rounded-md border border-ink-300 bg-white px-2 py-2 text-base sm:text-sm focus:border-copper-500 focus:outline-none focus:ring-2 focus:ring-copper-500/40";
const ONLY_LABELS: Record<Only, string> = {
  unsafe: "Only unsafe rows",
  violating: "Only violating rows",
  drive: "Only rows that drive",
  demand: "Only rows where it must drive",
  failing: "Only rows where it must drive and does not",
};
/** The rule type the rule picker offers for a row filter (require-drive for demand and failing). */
const ruleTypeFor = (only: Only | undefined) => (only === "demand" || only === "failing" ? "require-drive" : "inhibit");

export function RowFilters({
  columns,
  query,
  onQuery,
  totalRows,
  onJump,
}: {
  columns: TableColumns;
  query: FilterQuery;
  onQuery: (q: FilterQuery) => void;
  /** Rows of the whole table: a jump goes to one of 0 … totalRows − 1. */
  totalRows: number;
  onJump: (row: number) => void;
}) {
  const [cond, setCond] = useState(columns.conditions[0]?.id ?? "");
  const [jump, setJump] = useState("");
  const condition = columns.conditions.find((c) => c.id === cond);
  const jumpInvalid = jump !== "" && (!/^[0-9]{1,10}$/.test(jump) || Number(jump) >= totalRows);

  function onAddCondition(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const state = new FormData(e.currentTarget).get("state");
    if (typeof state !== "string" || !cond) return;
    if (query.where.some((w) => w.cond === cond && w.state === state)) return;
    onQuery({ ...query, where: [...query.where, { cond, state }] });
  }

  function onJumpSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    if (!/^[0-9]{1,10}$/.test(jump) || Number(jump) >= totalRows) return;
    onJump(Number(jump));
  }

  return (
    <Card className="mb-4 grid gap-3 md:grid-cols-2" role="group" aria-label="Row filters">
      <div>
        <label htmlFor="tt-only" className="block text-sm font-medium text-ink-700">
          Rows
        </label>
        <select
          id="tt-only"
          className={selectClass}
          value={query.only ?? ""}
          onChange={(e) => {
            const only = (e.target.value || undefined) as Only | undefined;
            // A rule of the other type does not go with the new choice.
            const keep = query.rule && columns.rules.some((r) => r.id === query.rule && r.type === ruleTypeFor(only));
            onQuery({ ...query, only, rule: keep ? query.rule : undefined });
          }}
        >
          <option value="">All rows</option>
          {ONLY.map((o) => (
            <option key={o} value={o}>
              {ONLY_LABELS[o]}
            </option>
          ))}
        </select>
      </div>
      <div>
        <label htmlFor="tt-rule" className="block text-sm font-medium text-ink-700">
          Rule (for unsafe / violating, or must-drive demand / failing)
        </label>
        <select
          id="tt-rule"
          className={selectClass}
          value={query.rule ?? ""}
          disabled={query.only === undefined || query.only === "drive"}
          onChange={(e) => onQuery({ ...query, rule: e.target.value || undefined })}
        >
          <option value="">{ruleTypeFor(query.only) === "inhibit" ? "Any inhibit rule" : "Any must-drive rule"}</option>
          {columns.rules
            .filter((r) => r.type === ruleTypeFor(query.only))
            .map((r) => (
              <option key={r.id} value={r.id}>
                {r.id}: {r.label}
              </option>
            ))}
        </select>
      </div>
      <form onSubmit={onAddCondition} className="flex items-end gap-2" aria-label="Condition filter">
        <div className="min-w-0 flex-1">
          <label htmlFor="tt-cond" className="block text-sm font-medium text-ink-700">
            Condition
          </label>
          <select id="tt-cond" className={selectClass} value={cond} onChange={(e) => setCond(e.target.value)}>
            {columns.conditions.map((c) => (
              <option key={c.id} value={c.id}>
                {c.label}
              </option>
            ))}
          </select>
        </div>
        <div className="min-w-0 flex-1">
          <label htmlFor="tt-state" className="block text-sm font-medium text-ink-700">
            equals
          </label>
          <select id="tt-state" name="state" className={selectClass} key={cond}>
            {condition?.states.map((s) => (
              <option key={s} value={s}>
                {s}
              </option>
            ))}
          </select>
        </div>
        <Button type="submit" variant="secondary">
          Add
        </Button>
      </form>
      <form onSubmit={onJumpSubmit} className="flex items-end gap-2" aria-label="Jump to row">
        <div className="min-w-0 flex-1">
          <label htmlFor="tt-jump" className="block text-sm font-medium text-ink-700">
            Jump to row
          </label>
          <input
            id="tt-jump"
            inputMode="numeric"
            value={jump}
            onChange={(e) => setJump(e.target.value.trim())}
            placeholder={`0 – ${(totalRows - 1).toLocaleString("en-US")}`}
            aria-invalid={jumpInvalid || undefined}
            aria-describedby={jumpInvalid ? "tt-jump-error" : undefined}
            className={`${selectClass} ${jumpInvalid ? "border-brick-600" : ""}`}
          />
        </div>
        <Button type="submit" variant="secondary">
          Go
        </Button>
      </form>
      {jumpInvalid ? (
        <p id="tt-jump-error" className="text-sm text-brick-700 md:col-span-2" role="alert">
          Enter a row number from 0 to {(totalRows - 1).toLocaleString("en-US")}.
        </p>
      ) : null}
    </Card>
  );
}
