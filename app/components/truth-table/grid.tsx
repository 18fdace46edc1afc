// The truth table itself: grouped, sticky column headers and one line per row. Rows are given
// (a page at a time on screen, or the whole small table in the printed report).
import type { TableColumns, TableRow } from "~/reviews/truth-table";
import type { Band } from "~/reviews/print-bands";
import { ContactCell, DriveCell, LiveCell, RuleCellView } from "./cells";

const thScreen = "whitespace-nowrap border-b border-ink-200 bg-ink-50 px-2 py-1 text-left text-xs font-medium text-ink-600";
const thDense = "whitespace-nowrap border-b border-ink-200 bg-ink-50 px-1 py-0.5 text-left font-medium text-ink-600";
const group = "whitespace-nowrap border-b border-l border-ink-200 bg-ink-100 px-2 py-1 text-left text-xs font-semibold uppercase tracking-wide text-ink-700";
// On paper a group's name may wrap rather than widen a band beyond the page.
const groupDense = "whitespace-normal border-b border-l border-ink-200 bg-ink-100 px-1 py-0.5 text-left font-semibold uppercase tracking-wide text-ink-700";
const tdScreen = "whitespace-nowrap px-2 py-1";
const tdDense = "whitespace-nowrap px-1 py-0";

export function TruthTableGrid({
  columns,
  rows,
  selected,
  onSelect,
  sticky = true,
  caption,
  band,
  dense = false,
}: {
  columns: TableColumns;
  rows: TableRow[];
  selected?: number | null;
  onSelect?: (index: number) => void;
  sticky?: boolean;
  caption?: string;
  /** Only these columns beside the row number and the conditions (the printed report's bands). */
  band?: Band;
  /** Paper: 9 px type and narrow padding (the widths print-bands.ts counts with). */
  dense?: boolean;
}) {
  const th = dense ? thDense : thScreen;
  const td = dense ? tdDense : tdScreen;
  const pick = <T,>(all: T[], ix: number[] | undefined) => (ix ? ix.map((i) => all[i]!) : all);
  const conditions = columns.conditions;
  const contacts = pick(columns.contacts, band?.contacts);
  const inputs = pick(columns.inputs, band?.inputs);
  const rules = pick(columns.rules, band?.rules);
  const showController = band?.controller ?? true;
  const showDrive = band?.drive ?? true;
  const stickyHead = sticky ? "sticky z-10" : "";
  const groupClass = dense ? groupDense : group;
  return (
    <table className={`border-separate border-spacing-0 font-mono tabular-nums ${dense ? "text-[9px] leading-tight" : "min-w-full text-xs"}`} data-testid="truth-table">
      {caption ? <caption className="sr-only">{caption}</caption> : null}
      <thead>
        <tr className={`${stickyHead} top-0`}>
          <th scope="col" rowSpan={2} className={`${groupClass} border-l-0 ${sticky ? "sticky left-0 z-20" : ""}`}>
            Row
          </th>
          <th scope="colgroup" colSpan={conditions.length} className={groupClass}>
            Conditions
          </th>
          {contacts.length > 0 ? (
            <th scope="colgroup" colSpan={contacts.length} className={groupClass}>
              Contacts
            </th>
          ) : null}
          {inputs.length > 0 ? (
            <th scope="colgroup" colSpan={inputs.length} className={groupClass}>
              Inputs energized
            </th>
          ) : null}
          {showController ? (
            <th scope="colgroup" colSpan={5} className={groupClass}>
              Controller view
            </th>
          ) : null}
          {showDrive ? (
            <th scope="col" rowSpan={2} className={groupClass}>
              Drive
            </th>
          ) : null}
          {rules.length > 0 ? (
            <th scope="colgroup" colSpan={rules.length} className={groupClass}>
              Rules (unsafe / violating; must drive: demand / failing)
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
          {showController ? (
            <>
              <th scope="col" className={`${th} border-l border-ink-200`}>powered</th>
              <th scope="col" className={th}>enabled</th>
              <th scope="col" className={th}>direction</th>
              <th scope="col" className={th}>braking</th>
              <th scope="col" className={th}>throttle</th>
            </>
          ) : null}
          {rules.map((r, i) => (
            <th key={r.id} scope="col" className={`${th} ${i === 0 ? "border-l border-ink-200" : ""}`} title={r.type === "require-drive" ? `Must drive: ${r.label}` : r.label}>
              {r.id}
              {r.type === "require-drive" ? <span className="font-normal text-ink-400"> must drive</span> : null}
            </th>
          ))}
        </tr>
      </thead>
      <tbody>
        {rows.map((r) => {
          const isSelected = selected === r.index;
          const bad = r.rules.includes("violating") || r.rules.includes("failing");
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
              {pick(r.contacts, band?.contacts).map((c, i) => (
                <td key={`c${i}`} className={td}>
                  <ContactCell closed={c} />
                </td>
              ))}
              {pick(r.inputs, band?.inputs).map((x, i) => (
                <td key={`i${i}`} className={td}>
                  <LiveCell on={x} yes="live" no="dead" />
                </td>
              ))}
              {showController ? (
                <>
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
                </>
              ) : null}
              {showDrive ? (
                <td className={td}>
                  <DriveCell drive={r.drive} />
                </td>
              ) : null}
              {pick(r.rules, band?.rules).map((c, i) => (
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
