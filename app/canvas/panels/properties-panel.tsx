// Properties of the selected component (id, label, and per kind: condition/closedIn/part or
// function), with series/parallel/duplicate/delete; the design's name when nothing is selected.
import { useEffect, useState } from "react";
import { INPUT_FUNCTIONS, type InputFunction } from "../../engine";
import { contactSense } from "../nodes/contact";
import { FUNCTION_LABEL } from "../nodes/input";
import { useEditor } from "../store";
import type { CanvasNode } from "../types";
import { FieldProblems, Section, Select, Small, StateChips, Text, problemsUnder, toggle, useValidation } from "./common";

export function PropertiesPanel() {
  const selected = useEditor((s) => {
    const picked = s.nodes.filter((n) => n.selected);
    return picked.length === 1 ? picked[0] : null;
  });
  const count = useEditor((s) => s.nodes.filter((n) => n.selected).length);
  const name = useEditor((s) => s.rest.name);
  const editable = useEditor((s) => !s.readOnly && s.simulation === null);
  const updateRest = useEditor((s) => s.updateRest);
  if (!selected) {
    return (
      <Section title="Design">
        <Text label="Design name" value={name} disabled={!editable} onChange={(e) => updateRest((r) => ({ ...r, name: e.target.value }), "name")} />
        <p className="text-sm text-ink-500">
          {count > 1
            ? `${count} components selected.`
            : editable
              ? "Select a component to edit it. Drag components from the palette, then drag from one terminal to another to wire them."
              : "Select a component to see its details."}
        </p>
      </Section>
    );
  }
  return <ComponentForm key={selected.id} node={selected} editable={editable} />;
}

function ComponentForm({ node, editable }: { node: CanvasNode; editable: boolean }) {
  const index = useEditor((s) => s.nodes.findIndex((n) => n.id === node.id));
  const conditions = useEditor((s) => s.rest.conditions);
  const usedFunctions = useEditor((s) => s.nodes.filter((n) => n.type === "input" && n.id !== node.id).map((n) => (n.data as { function: string }).function).join(","));
  const update = useEditor((s) => s.updateComponent);
  const rename = useEditor((s) => s.renameComponent);
  const addBeside = useEditor((s) => s.addBeside);
  const duplicate = useEditor((s) => s.duplicateSelected);
  const remove = useEditor((s) => s.deleteSelected);
  const problems = problemsUnder(useValidation(), `components[${index}]`);
  const [id, setId] = useState(node.id);
  const [idError, setIdError] = useState<string | null>(null);
  useEffect(() => setId(node.id), [node.id]);

  const commitId = () => {
    if (id === node.id) return setIdError(null);
    setIdError(rename(node.id, id));
  };
  const kindTitle = { supply: "Supply", contact: "Contact", junction: "Junction", input: "Controller input" }[node.type];

  return (
    <div>
      <Section title={kindTitle}>
        <div>
          <Text
            label="Id"
            value={id}
            disabled={!editable}
            invalid={Boolean(idError)}
            onChange={(e) => setId(e.target.value)}
            onBlur={commitId}
            onKeyDown={(e) => {
              if (e.key === "Enter") commitId();
            }}
          />
          {idError ? (
            <p className="mt-1 text-xs text-brick-700" role="alert">
              {idError}
            </p>
          ) : null}
        </div>
        <Text label="Label" value={node.data.label ?? ""} disabled={!editable} onChange={(e) => update(node.id, { label: e.target.value }, `label:${node.id}`)} />
        {node.type === "contact" ? (
          <ContactFields node={node} editable={editable} conditions={conditions} update={update} />
        ) : null}
        {node.type === "input" ? (
          <Select
            label="Function"
            value={node.data.function}
            disabled={!editable}
            onChange={(e) => update(node.id, { function: e.target.value as InputFunction })}
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
                <Small onClick={() => addBeside("series", node.id)}>Add in series</Small>
                <Small onClick={() => addBeside("parallel", node.id)}>Add in parallel</Small>
              </>
            ) : null}
            {node.type !== "input" ? <Small onClick={duplicate}>Duplicate</Small> : null}
            <Small tone="danger" onClick={remove}>
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
  conditions: ReturnType<typeof useEditor<import("../types").DesignRest["conditions"]>>;
  update: (id: string, data: Partial<CanvasNode["data"]>, tag?: string) => void;
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
          update(node.id, { condition: e.target.value, closedIn: c ? [c.states[1] ?? c.states[0]] : [] });
        }}
      >
        {cond ? null : <option value={node.data.condition}>{node.data.condition || "(pick a condition)"}</option>}
        {conditions.map((c) => (
          <option key={c.id} value={c.id}>
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
          onToggle={(st) => update(node.id, { closedIn: toggle(node.data.closedIn, st, cond?.states ?? []) })}
        />
        {sense !== "unknown" ? (
          <p className="mt-1 text-xs text-ink-500">
            {sense === "normally-closed" ? "Normally closed" : "Normally open"}: {sense === "normally-closed" ? "conducts" : "open"} in the rest state “{cond?.states[0]}”.
          </p>
        ) : null}
      </div>
      <Text label="Part (optional)" value={node.data.part ?? ""} disabled={!editable} onChange={(e) => update(node.id, { part: e.target.value || undefined }, `part:${node.id}`)} />
    </>
  );
}
