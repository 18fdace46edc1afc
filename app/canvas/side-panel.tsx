// The side panels behind tabs. Only the properties panel is part of the first paint; the others
// load when their tab is first opened.
import { lazy, Suspense } from "react";
import { PropertiesPanel } from "./panels/properties-panel";
import { useEditor, type Panel } from "./store";
import { Tab, TabList } from "~/components/ui/tabs";
import { Badge } from "~/components/ui/badge";

const ConditionsPanel = lazy(() => import("./panels/conditions-panel").then((m) => ({ default: m.ConditionsPanel })));
const ControllerPanel = lazy(() => import("./panels/controller-panel").then((m) => ({ default: m.ControllerPanel })));
const RulesPanel = lazy(() => import("./panels/rules-panel").then((m) => ({ default: m.RulesPanel })));
const ProblemsPanel = lazy(() => import("./panels/problems-panel").then((m) => ({ default: m.ProblemsPanel })));
const SimulatePanel = lazy(() => import("./panels/simulate-panel").then((m) => ({ default: m.SimulatePanel })));

const TABS: Array<{ id: Panel; label: string }> = [
  { id: "properties", label: "Properties" },
  { id: "conditions", label: "Conditions" },
  { id: "controller", label: "Controller" },
  { id: "rules", label: "Rules" },
  { id: "problems", label: "Problems" },
  { id: "simulate", label: "Simulate" },
];

export function SidePanel() {
  const panel = useEditor((s) => s.panel);
  const setPanel = useEditor((s) => s.setPanel);
  const failing = useEditor((s) =>
    s.proof.status === "invalid"
      ? s.proof.problems.length
      : s.proof.status === "done"
        ? s.proof.verdict.rules.filter((r) => !r.holds).length
        : 0,
  );
  return (
    <aside
      className="flex min-w-0 flex-none flex-col border-t border-ink-200 bg-ink-50 md:w-80 md:border-t-0 md:border-l"
      aria-label="Design details"
    >
      <TabList aria-label="Panels">
        {TABS.map((t) => (
          <Tab key={t.id} id={`cp-tab-${t.id}`} selected={panel === t.id} aria-controls="cp-panel" onClick={() => setPanel(t.id)}>
            {t.label}
            {t.id === "problems" && failing > 0 ? (
              <Badge tone="failing-solid" size="xs" className="ml-1">
                {failing}
              </Badge>
            ) : null}
          </Tab>
        ))}
      </TabList>
      <div id="cp-panel" role="tabpanel" aria-labelledby={`cp-tab-${panel}`} className="min-w-0 md:min-h-0 md:flex-1 md:overflow-y-auto">
        <Suspense fallback={<p className="p-3 text-sm text-ink-500">Opening…</p>}>
          {panel === "properties" ? <PropertiesPanel /> : null}
          {panel === "conditions" ? <ConditionsPanel /> : null}
          {panel === "controller" ? <ControllerPanel /> : null}
          {panel === "rules" ? <RulesPanel /> : null}
          {panel === "problems" ? <ProblemsPanel /> : null}
          {panel === "simulate" ? <SimulatePanel /> : null}
        </Suspense>
      </div>
    </aside>
  );
}
