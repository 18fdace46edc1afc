// The truth table itself: grouped, sticky column headers and one line per row. Rows are given
// (a page at a time on screen, or the whole small table in the printed report).
import type { TableColumns, TableRow } from "~/reviews/truth-table";
import { ContactCell, DriveCell, LiveCell, RuleCellView } from "./cells";

const th = "whitespace-nowrap border-b border-ink-200 bg-ink-50 px-2 py-1 text-left text-xs font-medium text-ink-600";
const group = "whitespace-nowrap border-b border-l border-ink-200 bg-ink-100 px-2 py-1 text-left text-xs font-semibold uppercase tracking-wide text-ink-700";
const td = "whitespace-nowrap px-2 py-1";

export function TruthTableGrid({
  columns,
  rows,
  selected,
  onSelect,
  sticky = true,
  caption,
}: {
  columns: TableColumns;
  rows: TableRow[];
  selected?: number | null;
  onSelect?: (index: number) => void;
  sticky?: boolean;
  caption?: string;
}) {
  const { conditions, contacts, inputs, rules } = columns;
  const stickyHead = sticky ? "sticky z-10" : "";
  return (
    <table className="min-w-full border-separate border-spacing-0 font-mono text-xs tabular-nums" data-testid="truth-table">
      {caption ? <caption className="sr-only">{caption}</caption> : null}
      <thead>
        <tr className={`${stickyHead} top-0`}>
          <th scope="col" rowSpan={2} className={`${group} border-l-0 ${sticky ? "sticky left-0 z-20" : ""}`}>
            Row
          </th>
          <th scope="colgroup" colSpan={conditions.length} className={group}>
            Conditions
          </th>
          {contacts.length > 0 ? (
            <th scope="colgroup" colSpan={contacts.length} className={group}>
              Contacts
            </th>
          ) : null}
          {inputs.length > 0 ? (
            <th scope="colgroup" colSpan={inputs.length} className={group}>
              Inputs energized
            </th>
          ) : null}
          <th scope="colgroup" colSpan={5} className={group}>
            Controller view
          </th>
          <th scope="col" rowSpan={2} className={group}>
            Drive
          </th>
          {rules.length > 0 ? (
            <th scope="colgroup" colSpan={rules.length} className={group}>
              Inhibit rules (unsafe / violating)
            </th>
          ) : null}
        </tr>
        <tr className={`${stickyHead} top-[25px]`}>
          {conditions.map((c, i) => (
            <th key={c.id} scope="col" className={`${th} ${i === 0 ? "border-l border-ink-200" : ""}`} title={c.label}>
              {c.id}
            </th>
          ))}
          {contacts.map((c, i) => (
            <th key={c.id} scope="col" className={`${th} ${i === 0 ? "border-l border-ink-200" : ""}`} title={`${c.label} (on ${c.condition})`}>
              {c.id}
            </th>
          ))}
          {inputs.map((x, i) => (
            <th key={x.id} scope="col" className={`${th} ${i === 0 ? "border-l border-ink-200" : ""}`} title={`${x.label}: ${x.fn}`}>
              {x.id} <span className="font-normal text-ink-400">{x.fn}</span>
            </th>
          ))}
          <th scope="col" className={`${th} border-l border-ink-200`}>powered</th>
          <th scope="col" className={th}>enabled</th>
          <th scope="col" className={th}>direction</th>
          <th scope="col" className={th}>braking</th>
          <th scope="col" className={th}>throttle</th>
          {rules.map((r, i) => (
            <th key={r.id} scope="col" className={`${th} ${i === 0 ? "border-l border-ink-200" : ""}`} title={r.label}>
              {r.id}
            </th>
          ))}
        </tr>
      </thead>
      <tbody>
        {rows.map((r) => {
          const isSelected = selected === r.index;
          const bad = r.rules.includes("violating");
          return (
            <tr
              key={r.index}
              data-row={r.index}
              aria-selected={onSelect ? isSelected : undefined}
              className={`${isSelected ? "bg-copper-50" : bad ? "bg-brick-50/60" : "odd:bg-white even:bg-ink-50/50"} ${onSelect ? "cursor-pointer hover:bg-copper-50" : ""}`}
              onClick={onSelect ? () => onSelect(r.index) : undefined}
            >
              <th scope="row" className={`${td} border-r border-ink-100 text-right font-semibold text-ink-700 ${sticky ? "sticky left-0 bg-inherit" : ""}`}>
                {onSelect ? (
                  <button
                    type="button"
                    className="underline decoration-ink-300 underline-offset-2 hover:text-copper-700"
                    onClick={(e) => {
                      e.stopPropagation();
                      onSelect(r.index);
                    }}
                    aria-label={`Row ${r.index}: open its diagnosis`}
                  >
                    {r.index}
                  </button>
                ) : (
                  r.index
                )}
              </th>
              {r.states.map((s, i) => (
                <td key={`s${i}`} className={`${td} text-ink-900`}>
                  {s}
                </td>
              ))}
              {r.contacts.map((c, i) => (
                <td key={`c${i}`} className={td}>
                  <ContactCell closed={c} />
                </td>
              ))}
              {r.inputs.map((x, i) => (
                <td key={`i${i}`} className={td}>
                  <LiveCell on={x} yes="live" no="dead" />
                </td>
              ))}
              <td className={td}>
                <LiveCell on={r.powered} yes="yes" no="no" />
              </td>
              <td className={td}>
                <LiveCell on={r.enabled} yes="yes" no="no" />
              </td>
              <td className={`${td} ${r.direction === "conflict" ? "font-semibold text-brick-700" : ""}`}>{r.direction}</td>
              <td className={td}>
                <LiveCell on={r.braking} yes="yes" no="no" />
              </td>
              <td className={`${td} ${r.throttle === "fault" ? "font-semibold text-brick-700" : ""}`}>{r.throttle}</td>
              <td className={td}>
                <DriveCell drive={r.drive} />
              </td>
              {r.rules.map((c, i) => (
                <td key={`r${i}`} className={td}>
                  <RuleCellView cell={c} />
                </td>
              ))}
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}
