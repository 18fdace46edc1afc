// A list of bench-test runs with their state: in progress, completed, with failures.
import { Link } from "react-router";
import { When } from "~/designs/design-bits";
import { Badge } from "~/components/ui/badge";

export type RunRow = {
  id: string;
  status: "in-progress" | "completed";
  startedAt: string;
  completedAt: string | null;
  vehicleId: string;
  vehicleName: string;
  designName: string;
  number: number;
  startedByName: string;
  total: number;
  done: number;
  failed: number;
  skipped: number;
};

export function RunBadge({ run }: { run: Pick<RunRow, "status" | "failed"> }) {
  if (run.failed > 0) {
    return (
      <Badge tone="failing-solid">
        {run.status === "completed" ? "Completed, " : ""}
        {run.failed} failed
      </Badge>
    );
  }
  if (run.status === "completed") return <Badge tone="proven-solid">Completed</Badge>;
  return <Badge tone="caution-quiet">In progress</Badge>;
}

export function RunList({ slug, runs, showVehicle = true, empty }: { slug: string; runs: RunRow[]; showVehicle?: boolean; empty: string }) {
  if (runs.length === 0) return <p className="mt-2 text-sm text-ink-600">{empty}</p>;
  return (
    <ul className="mt-3 divide-y divide-ink-200" data-testid="run-list">
      {runs.map((r) => (
        <li key={r.id}>
          <Link
            to={`/w/${slug}/bench-tests/${r.id}`}
            className="flex min-h-14 flex-wrap items-center justify-between gap-2 py-3 hover:bg-ink-50"
          >
            <span>
              <span className="block font-medium">
                {showVehicle ? `${r.vehicleName} · ` : ""}
                {r.designName}, revision {r.number}
              </span>
              <span className="block text-sm text-ink-600">
                {r.startedByName}, started <When iso={r.startedAt} />
                {r.completedAt ? (
                  <>
                    , completed <When iso={r.completedAt} />
                  </>
                ) : null}{" "}
                · {r.done} of {r.total} steps{r.skipped ? `, ${r.skipped} skipped` : ""}
              </span>
            </span>
            <RunBadge run={r} />
          </Link>
        </li>
      ))}
    </ul>
  );
}
