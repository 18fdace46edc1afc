// Every bench-test run of the workspace: in progress, completed, with failures.
import { Link } from "react-router";
import type { Route } from "./+types/bench-tests";
import { requireCan } from "~/auth/context.server";
import { can } from "~/lib/roles";
import { listRuns, type RunFilter } from "~/bench-runs/bench-runs.server";
import { PageHeader } from "~/components/page-header";
import { EmptyState } from "~/components/empty-state";
import { SafetyNote } from "~/components/safety-note";
import { RunList } from "~/components/diagnosis/run-list";
import { cardVariants } from "~/components/ui/card";

export const meta: Route.MetaFunction = () => [{ title: "Bench tests · Chainproof" }];

const FILTERS = [
  { value: "", label: "All" },
  { value: "in-progress", label: "In progress" },
  { value: "completed", label: "Completed" },
  { value: "failures", label: "With failures" },
] as const;

export async function loader({ request, context }: Route.LoaderArgs) {
  const m = requireCan(context, "workspace.view");
  const asked = new URL(request.url).searchParams.get("status") ?? "";
  const status = FILTERS.some((f) => f.value === asked) && asked ? (asked as RunFilter["status"]) : undefined;
  const runs = await listRuns(m.workspace.id, { status });
  return {
    slug: m.workspace.slug,
    status: status ?? "",
    isTechnician: can(m.role, "bench.run"),
    runs: runs.map((r) => ({ ...r, startedAt: r.startedAt.toISOString(), completedAt: r.completedAt?.toISOString() ?? null })),
  };
}

export default function BenchTests({ loaderData }: Route.ComponentProps) {
  const { runs, slug, status } = loaderData;
  return (
    <>
      <PageHeader
        title="Bench tests"
        description="Step-by-step checks generated from a vehicle's released design, run on the bench and kept as signed records."
      />
      <nav aria-label="Filter runs" className="mb-4 flex flex-wrap gap-2">
        {FILTERS.map((f) => (
          <Link
            key={f.value}
            to={f.value ? `?status=${f.value}` : "."}
            aria-current={status === f.value ? "page" : undefined}
            className={`inline-flex min-h-11 items-center rounded-full border px-4 text-sm font-medium ${
              status === f.value ? "border-ink-800 bg-ink-800 text-white" : "border-ink-300 bg-white hover:bg-ink-100"
            }`}
          >
            {f.label}
          </Link>
        ))}
      </nav>
      {runs.length === 0 && !status ? (
        <EmptyState title="No bench-test runs yet">
          {loaderData.isTechnician
            ? "Once a revision is released to a vehicle, start a bench test from the vehicle's page."
            : "Technicians run bench tests on vehicles with a released revision; their records appear here."}
        </EmptyState>
      ) : (
        <div className={cardVariants({ padding: "none", className: "px-4" })}>
          <RunList slug={slug} runs={runs} empty="No runs match this filter." />
        </div>
      )}
      <SafetyNote className="mt-6" />
    </>
  );
}
