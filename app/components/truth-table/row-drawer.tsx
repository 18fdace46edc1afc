// The panel a truth-table row opens: the engine's diagnosis of that row, a link that simulates it
// on the canvas and one that pins a review comment to it.
import { Link } from "react-router";
import useSWR from "swr";
import type { TableColumns } from "~/reviews/truth-table";
import { api } from "~/api/endpoints";
import { ApiError, apiFetcher } from "~/api/client";
import type { RowDetail } from "~/api/answers";
import { DriveCell, RuleCellView } from "./cells";
import { Button } from "~/components/ui/button";
import { Card } from "~/components/ui/card";

const fetchRow = apiFetcher(api.revisionRow);

export function RowDrawer({
  columns,
  apiPath,
  index,
  simulateHref,
  commentHref,
  onClose,
}: {
  columns: TableColumns;
  apiPath: string;
  index: number;
  simulateHref: string;
  commentHref: string;
  onClose: () => void;
}) {
  const { data, error, isLoading } = useSWR(apiPath, fetchRow, { revalidateOnFocus: false });
  return (
    <aside
      aria-label={`Row ${index}`}
      className="fixed inset-x-0 bottom-0 z-40 max-h-[75vh] overflow-y-auto border-t border-ink-300 bg-white p-4 shadow-2xl sm:inset-y-0 sm:left-auto sm:right-0 sm:max-h-none sm:w-[26rem] sm:border-l sm:border-t-0"
      data-testid="row-drawer"
    >
      <div className="flex items-start justify-between gap-3">
        <h2 className="text-lg font-semibold">Row {index}</h2>
        <Button type="button" variant="ghost" onClick={onClose}>
          Close
        </Button>
      </div>
      <div className="mt-2 flex flex-wrap gap-2">
        <Link
          to={simulateHref}
          className="inline-flex min-h-10 items-center rounded-md bg-copper-600 px-3 text-sm font-semibold text-white hover:bg-copper-700"
        >
          Simulate this row on the canvas
        </Link>
        <Link
          to={commentHref}
          className="inline-flex min-h-10 items-center rounded-md border border-ink-300 px-3 text-sm font-semibold text-ink-800 hover:bg-ink-100"
        >
          Comment on this row
        </Link>
      </div>
      {isLoading ? <p className="mt-4 text-sm text-ink-600">Diagnosing row {index}…</p> : null}
      {error ? (
        <p className="mt-4 text-sm text-brick-700" role="alert">
          {error instanceof ApiError ? error.detail : "The diagnosis could not be loaded."}
        </p>
      ) : null}
      {data ? <DiagnosisView columns={columns} detail={data} /> : null}
    </aside>
  );
}

function DiagnosisView({ columns, detail }: { columns: TableColumns; detail: RowDetail }) {
  const { row, diagnosis } = detail;
  return (
    <div className="mt-4 space-y-4 text-sm">
      <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1">
        {columns.conditions.map((c, i) => (
          <div key={c.id} className="contents">
            <dt className="text-ink-500">{c.label}</dt>
            <dd className="font-medium">{row.states[i]}</dd>
          </div>
        ))}
      </dl>
      <div className="flex items-center gap-2">
        <span className="text-ink-600">Steady drive:</span> <DriveCell drive={diagnosis.steadyDrive} />
      </div>
      {diagnosis.reasons.length > 0 ? (
        <div>
          <h3 className="font-semibold">Why the drive is off</h3>
          <ul className="mt-1 list-inside list-disc space-y-1 text-ink-800">
            {diagnosis.reasons.map((r, i) => (
              <li key={i}>{r.message}</li>
            ))}
          </ul>
        </div>
      ) : null}
      {columns.rules.length > 0 ? (
        <div>
          <h3 className="font-semibold">Inhibit rules in this row</h3>
          <ul className="mt-1 space-y-1">
            {columns.rules.map((r, i) => (
              <li key={r.id} className="flex items-center justify-between gap-2">
                <span>
                  {r.label} <code className="text-xs text-ink-500">{r.id}</code>
                </span>
                <RuleCellView cell={row.rules[i]!} />
              </li>
            ))}
          </ul>
        </div>
      ) : null}
      <div>
        <h3 className="font-semibold">Controller inputs</h3>
        <ul className="mt-1 space-y-2">
          {diagnosis.inputs.map((x) => (
            <Card as="li" key={x.input} padding="xs">
              <p>
                <span className="font-medium">{x.label}</span> <code className="text-xs text-ink-500">{x.input}</code> ({x.function}):{" "}
                {x.energized ? <strong>energized</strong> : <span>dead</span>}
              </p>
              {!x.energized && x.unreachable ? (
                <p className="text-ink-600">No contact closing would energize it: it is not wired towards a supply.</p>
              ) : null}
              {!x.energized && x.fixes.length > 0 ? (
                <div className="mt-1 text-ink-700">
                  Closing any of these sets would energize it:
                  <ul className="mt-1 list-inside list-disc">
                    {x.fixes.slice(0, 5).map((set, i) => (
                      <li key={i}>{set.map((k) => `${k.label} (${k.contact}: ${k.condition} ${k.closeIn.join(" or ")})`).join(" + ")}</li>
                    ))}
                  </ul>
                  {x.fixes.length > 5 || x.truncated ? <p className="text-xs text-ink-500">and more.</p> : null}
                </div>
              ) : null}
            </Card>
          ))}
        </ul>
      </div>
    </div>
  );
}
