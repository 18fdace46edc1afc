// Problems by field path, each with a way to the component it is about.
import type { Problem } from "../../engine";
import { useEditor, useEditorStore } from "../store";
import { Small } from "./common";

export function ProblemList({ problems }: { problems: readonly Problem[] }) {
  const store = useEditorStore();
  const nodes = useEditor((s) => s.nodes);
  return (
    <ul className="space-y-1" aria-label="Problems by field">
      {problems.map((p) => {
        const m = /^components\[(\d+)\]/.exec(p.path);
        const node = m ? nodes[Number(m[1])] : undefined;
        return (
          <li
            key={`${p.path}:${p.message}`}
            className="rounded border border-brick-100 bg-brick-50 px-2 py-1 text-sm text-brick-700 [overflow-wrap:anywhere]"
          >
            <code className="font-mono text-xs font-semibold">{p.path || "(document)"}</code> {p.message}
            {node ? (
              <Small
                tone="ghost"
                className="ml-1"
                onClick={() => (store.getState().select(node.id), store.getState().setPanel("properties"))}
              >
                Select {node.id}
              </Small>
            ) : null}
          </li>
        );
      })}
    </ul>
  );
}
