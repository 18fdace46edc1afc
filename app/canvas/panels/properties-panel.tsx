// Properties of the selection: the selected component (id, label, and per kind: condition and
// closed-in states, or function) with series/parallel/duplicate/delete; the selected wire and its
// two ends; the design's name when nothing is selected. Text fields commit on Enter or when left.
import { useState } from "react";
import { INPUT_FUNCTIONS, type InputFunction } from "../../engine/vocabulary";
import { contactSense, FUNCTION_LABEL } from "../node-kinds";
import { useEditor, useEditorStore } from "../store";
import type { CanvasNode, DesignRest } from "../types";
import { CommitText, FieldProblems, Section, Select, Small, StateChips, problemsUnder, toggle, useValidation } from "./common";

export function PropertiesPanel() {
  const selected = useEditor((s) => {
    const picked = s.nodes.filter((n) => n.selected);
    return picked.length === 1 ? picked[0] : null;
  });
  const count = useEditor((s) => s.nodes.filter((n) => n.selected).length);
  const wire = useEditor((s) => {
    const picked = s.edges.filter((e) => e.selected);
    return picked.length === 1 && !s.nodes.some((n) => n.selected) ? picked[0] : null;
  });
  const editable = useEditor((s) => !s.readOnly && s.simulation === null);
  const formKey = useFollowingKey(selected?.id ?? null);
  if (selected) return <ComponentForm key={formKey} node={selected} editable={editable} />;
  if (wire)
    return (
      <WireDetails source={`${wire.source}.${wire.sourceHandle}`} target={`${wire.target}.${wire.targetHandle}`} editable={editable} />
    );
  return <DesignDetails count={count} editable={editable} />;
}

/**
 * A key for the component form that stays the same when the selected component is renamed (so the
 * form, and a button being clicked in it, survive the rename) and changes when the selection does.
 */
function useFollowingKey(id: string | null): number {
  const lastRename = useEditor((s) => s.lastRename);
  const [seen, setSeen] = useState<{ id: string | null; key: number }>({ id, key: 0 });
  if (seen.id !== id) {
    const followed = lastRename !== null && lastRename.from === seen.id && lastRename.to === id;
    const next = { id, key: followed ? seen.key : seen.key + 1 };
    setSeen(next);
    return next.key;
  }
  return seen.key;
}

function DesignDetails({ count, editable }: { count: number; editable: boolean }) {
  const name = useEditor((s) => s.rest.name);
  const store = useEditorStore();
  return (
    <Section title="Design">
      <CommitText
        label="Design name"
        value={name}
        disabled={!editable}
        maxLength={200}
        onCommit={(v) => store.getState().setDesignName(v)}
      />
      <p className="text-sm text-ink-500">
        {count > 1
          ? `${count} components selected.`
          : editable
            ? "Select a component to edit it. Add components from the palette; wire two terminals by dragging from one to the other, or by clicking one and then the other."
            : "Select a component to see its details."}
      </p>
    </Section>
  );
}

function WireDetails({ source, target, editable }: { source: string; target: string; editable: boolean }) {
  const remove = useEditor((s) => s.deleteSelected);
  return (
    <Section title="Wire">
      <p className="text-sm text-ink-800" data-testid="wire-ends">
        From <strong className="font-mono">{source}</strong> to <strong className="font-mono">{target}</strong>
      </p>
      <p className="text-xs text-ink-500">A wire joins two terminals into one net; it has no direction.</p>
      {editable ? (
        <Small tone="danger" onClick={remove}>
          Delete wire
        </Small>
      ) : null}
    </Section>
  );
}

function ComponentForm({ node, editable }: { node: CanvasNode; editable: boolean }) {
  const store = useEditorStore();
  const index = useEditor((s) => s.nodes.findIndex((n) => n.id === node.id));
  const conditions = useEditor((s) => s.rest.conditions);
  const usedFunctions = useEditor((s) =>
    s.nodes
      .filter((n) => n.type === "input" && n.id !== node.id)
      .map((n) => (n.data as { function: string }).function)
      .join(","),
  );
  const problems = problemsUnder(useValidation(), `components[${index}]`);
  const kindTitle = { supply: "Supply", contact: "Contact", junction: "Junction", input: "Controller input" }[node.type];
  const update = (data: Partial<CanvasNode["data"]>) => store.getState().updateComponent(node.id, data);
  // The buttons act on the selection as it is when clicked (after a rename that leaving the id field committed).
  const selectedId = () => store.getState().nodes.find((n) => n.selected)?.id ?? node.id;

  return (
    <div>
      <Section title={kindTitle}>
        <CommitText label="Id" value={node.id} disabled={!editable} onCommit={(v) => store.getState().renameComponent(node.id, v)} />
        <CommitText label="Label" value={node.data.label ?? ""} disabled={!editable} onCommit={(v) => (update({ label: v }), null)} />
        {node.type === "contact" ? <ContactFields node={node} editable={editable} conditions={conditions} update={update} /> : null}
        {node.type === "input" ? (
          <Select
            label="Function"
            value={node.data.function}
            disabled={!editable}
            onChange={(e) => update({ function: e.target.value as InputFunction })}
          >
            {INPUT_FUNCTIONS.map((f) => (
              <option key={f} value={f} disabled={usedFunctions.split(",").includes(f)}>
                {FUNCTION_LABEL[f]}
              </option>
            ))}
          </Select>
        ) : null}
        <FieldProblems problems={problems} />
      </Section>
      {editable ? (
        <Section title="Edit">
          <div className="flex flex-wrap gap-1">
            {node.type === "contact" ? (
              <>
                <Small onClick={() => store.getState().addBeside("series", selectedId())}>Add in series</Small>
                <Small onClick={() => store.getState().addBeside("parallel", selectedId())}>Add in parallel</Small>
              </>
            ) : null}
            {node.type !== "input" ? <Small onClick={() => store.getState().duplicateSelected()}>Duplicate</Small> : null}
            <Small tone="danger" onClick={() => store.getState().deleteSelected()}>
              Delete
            </Small>
          </div>
        </Section>
      ) : null}
    </div>
  );
}

function ContactFields({
  node,
  editable,
  conditions,
  update,
}: {
  node: Extract<CanvasNode, { type: "contact" }>;
  editable: boolean;
  conditions: DesignRest["conditions"];
  update: (data: Partial<CanvasNode["data"]>) => void;
}) {
  const cond = conditions.find((c) => c.id === node.data.condition);
  const sense = contactSense(node.data.closedIn, cond?.states);
  return (
    <>
      <Select
        label="Condition"
        value={node.data.condition}
        disabled={!editable}
        onChange={(e) => {
          const c = conditions.find((x) => x.id === e.target.value);
          update({ condition: e.target.value, closedIn: c ? [c.states[1] ?? c.states[0]] : [] });
        }}
      >
        {cond ? null : <option value={node.data.condition}>{node.data.condition || "(pick a condition)"}</option>}
        {conditions.map((c, i) => (
          <option key={i} value={c.id}>
            {c.label ? `${c.label} (${c.id})` : c.id}
          </option>
        ))}
      </Select>
      <div>
        <div className="text-xs font-medium text-ink-600">Closed (conducting) in</div>
        <StateChips
          label="Closed in states"
          states={cond?.states ?? []}
          picked={node.data.closedIn}
          disabled={!editable}
          onToggle={(st) => update({ closedIn: toggle(node.data.closedIn, st, cond?.states ?? []) })}
        />
        {sense !== "unknown" ? (
          <p className="mt-1 text-xs text-ink-500">
            {sense === "normally-closed" ? "Normally closed" : "Normally open"}: {sense === "normally-closed" ? "conducts" : "open"} in the
            rest state “{cond?.states[0]}”.
          </p>
        ) : null}
      </div>
      <CommitText
        label="Part (optional)"
        value={node.data.part ?? ""}
        disabled={!editable}
        onCommit={(v) => (update({ part: v || undefined }), null)}
      />
    </>
  );
}
