// A page that mounts the design editor on its own (no server, no router): for screenshots and
// for measuring the canvas in Chromium (test/bench/canvas-bench.ts). Saves are kept in memory and
// judged by the engine the way the server judges them.
import "./harness.css";
import { createRoot } from "react-dom/client";
import { prove, validateDesign } from "../../engine";
import { DesignEditor } from "../design-editor";
import { chainDesign } from "./designs";

const params = new URLSearchParams(location.search);
const which = params.get("design") ?? "empty";
const examples = import.meta.glob("../../../../shared/spec/examples/*.design.json", { eager: true, import: "default" });

function initial(): unknown {
  if (which.startsWith("chain-"))
    return chainDesign(Number(which.slice(6)), Number(params.get("conds") ?? Math.min(20, Number(which.slice(6)))));
  const ex = Object.entries(examples).find(([path]) => path.endsWith(`/${which}.design.json`));
  return ex ? ex[1] : {};
}

// Worker round trips of the live proof, as the editor does them (same worker module, same message).
(window as unknown as { __proofBench: (runs: number, contacts: number, conditions?: number) => Promise<number[]> }).__proofBench = async (
  runs,
  contacts,
  conditions,
) => {
  const worker = new Worker(new URL("../proof.worker.ts", import.meta.url), { type: "module" });
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const doc = chainDesign(contacts, conditions ?? contacts);
    doc.name = `run ${i}`; // a fresh document each time, as after an edit
    const started = performance.now();
    await new Promise<void>((resolve) => {
      worker.onmessage = () => resolve();
      worker.postMessage({ id: i + 1, doc });
    });
    times.push(performance.now() - started);
  }
  worker.terminate();
  return times;
};

let draftVersion = 0;
let revision = 0;
const w = window as unknown as { __saves: unknown[] };
w.__saves = [];

createRoot(document.getElementById("root")!).render(
  <DesignEditor
    initial={initial()}
    draftVersion={0}
    baseRevision={0}
    readOnly={params.get("readonly") === "1"}
    designName="Haybarn campus hauler #3"
    onSaveDraft={async (doc, version) => {
      if (version !== draftVersion) return { ok: false, status: 409, currentVersion: draftVersion };
      draftVersion += 1;
      w.__saves.push({ kind: "draft", version: draftVersion, doc });
      return { ok: true, version: draftVersion };
    }}
    onSaveRevision={async (doc, base) => {
      if (base !== revision) return { status: 409, latestRevision: revision };
      const v = validateDesign(doc);
      if (!v.ok) return { status: 400, problems: v.problems };
      const verdict = prove(v.design);
      if (!verdict.ok) return { status: 422, verdict };
      revision += 1;
      return { status: 201, revision: { number: revision, contentHash: `local-${revision}`, verdict } };
    }}
  />,
);
