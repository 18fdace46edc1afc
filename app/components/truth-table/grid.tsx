// The truth table itself: grouped, sticky column headers and one line per row. Rows are given
// (a page at a time on screen, or the whole small table in the printed report).
import type { RuleCell, TableColumns, TableRow } from "~/reviews/truth-table";
import type { Band } from "~/reviews/print-bands";
import { ContactCell, DriveCell, LiveCell, RuleCellView } from "./cells";
import { Button } from "~/components/ui/button";

const thScreen = "whitespace-nowrap border-b border-ink-200 bg-ink-50 px-2 py-1 text-left text-xs font-medium text-ink-600";
const thDense = "whitespace-nowrap border-b border-ink-200 bg-ink-50 px-1 py-0.5 text-left font-medium text-ink-600";
const group =
  "whitespace-nowrap border-b border-l border-ink-200 bg-ink-100 px-2 py-1 text-left text-xs font-semibold uppercase tracking-wide text-ink-700";
// On paper a group's name may wrap rather than widen a band beyond the page.
const groupDense =
  "whitespace-normal border-b border-l border-ink-200 bg-ink-100 px-1 py-0.5 text-left font-semibold uppercase tracking-wide text-ink-700";
const tdScreen = "whitespace-nowrap px-2 py-1";
const tdDense = "whitespace-nowrap px-1 py-0";

// On screen the drive and rule columns are fixed-width and stick to the right edge while the table
// scrolls sideways (from md up; a phone's width could not hold them and the conditions at once).
// Past STICKY_RULES rules, pinning them all would cover the table: a pinned "Rules" column beside
// the drive then says which rules the row violates or is unsafe for, and the rule columns scroll.
const DRIVE_REM = 6;
const RULE_REM = 7;
const SUMMARY_REM = 10;
const STICKY_RULES = 4;
const stickyRight = "md:sticky";
const stickyEdge = "shadow-[-6px_0_6px_-6px_rgba(24,27,33,0.35)]";
const rem = (n: number) => `${n}rem`;

/** A column heading on screen: the label a person knows, the id under it. */
function Heading({ label, id, extra }: { label: string; id: string; extra?: string }) {
  return (
    <>
      <span className="block max-w-[10rem] whitespace-normal font-sans text-xs font-semibold text-ink-800">{label || id}</span>
      <span className="block font-mono text-[10px] font-normal text-ink-500">
        {id}
        {extra ? ` · ${extra}` : ""}
      </span>
    </>
  );
}

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
  // The whole heading is one sticky box (one stacking context): a heading cell pinned left or right
  // then stays above the heading cells that scroll under it, whichever heading row they are in.
  const stickyHead = sticky ? "sticky top-0 z-10" : "";
  const groupClass = dense ? groupDense : group;
  // Labels first on screen; on paper the ids (the widths print-bands.ts counts with).
  const labelled = !dense;
  const pinRight = sticky && !dense;
  const pinRules = pinRight && rules.length <= STICKY_RULES;
  const pinSummary = pinRight && rules.length > STICKY_RULES;
  const driveRight = pinRules ? rules.length * RULE_REM : pinSummary ? SUMMARY_REM : 0;
  const driveStyle = pinRight
    ? { right: rem(driveRight), width: rem(DRIVE_REM), minWidth: rem(DRIVE_REM), maxWidth: rem(DRIVE_REM) }
    : undefined;
  const summaryStyle = { right: 0, width: rem(SUMMARY_REM), minWidth: rem(SUMMARY_REM), maxWidth: rem(SUMMARY_REM) };
  const ruleStyle = (i: number) =>
    pinRules
      ? { right: rem((rules.length - 1 - i) * RULE_REM), width: rem(RULE_REM), minWidth: rem(RULE_REM), maxWidth: rem(RULE_REM) }
      : undefined;
  const driveClass = pinRight ? `${stickyRight} ${stickyEdge}` : "";
  const ruleClass = (i: number) => (pinRules ? `${stickyRight} z-20 ${i === 0 && !showDrive ? stickyEdge : ""}` : "");
  return (
    <table
      className={`border-separate border-spacing-0 font-mono tabular-nums ${dense ? "text-[9px] leading-tight" : "min-w-full text-xs"}`}
      data-testid="truth-table"
    >
      {caption ? <caption className="sr-only">{caption}</caption> : null}
      <thead className={stickyHead}>
        <tr>
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
            <th
              scope="col"
              rowSpan={2}
              className={`${groupClass} ${driveClass} ${pinRight ? "z-20" : ""}`}
              style={driveStyle}
              data-col="drive"
            >
              Drive
            </th>
          ) : null}
          {pinSummary && showDrive ? (
            <th
              scope="col"
              rowSpan={2}
              className={`${groupClass} ${stickyRight} z-20 whitespace-normal`}
              style={summaryStyle}
              data-col="rules-summary"
            >
              Rules in this row
            </th>
          ) : null}
          {rules.length > 0 ? (
            <th
              scope="colgroup"
              colSpan={rules.length}
              className={`${groupClass} ${pinRules ? `${stickyRight} z-20` : ""}`}
              style={pinRules ? { right: 0, whiteSpace: "normal" } : undefined}
            >
              {labelled ? "Rules" : "Rules (unsafe / violating; must drive: demand / failing)"}
            </th>
          ) : null}
        </tr>
        <tr>
          {conditions.map((c, i) => (
            <th key={c.id} scope="col" className={`${th} ${i === 0 ? "border-l border-ink-200" : ""}`} title={c.label} data-col={c.id}>
              {labelled ? <Heading label={c.label} id={c.id} /> : c.id}
            </th>
          ))}
          {contacts.map((c, i) => (
            <th
              key={c.id}
              scope="col"
              className={`${th} ${i === 0 ? "border-l border-ink-200" : ""}`}
              title={`${c.label} (on ${c.condition})`}
              data-col={c.id}
            >
              {labelled ? <Heading label={c.label} id={c.id} /> : c.id}
            </th>
          ))}
          {inputs.map((x, i) => (
            <th
              key={x.id}
              scope="col"
              className={`${th} ${i === 0 ? "border-l border-ink-200" : ""}`}
              title={`${x.label}: ${x.fn}`}
              data-col={x.id}
            >
              {labelled ? (
                <Heading label={x.label} id={x.id} extra={x.fn} />
              ) : (
                <>
                  {x.id} <span className="font-normal text-ink-400">{x.fn}</span>
                </>
              )}
            </th>
          ))}
          {showController ? (
            <>
              <th scope="col" className={`${th} border-l border-ink-200`} data-col="controller-powered">
                powered
              </th>
              <th scope="col" className={th} data-col="controller-enabled">
                enabled
              </th>
              <th scope="col" className={th} data-col="controller-direction">
                direction
              </th>
              <th scope="col" className={th} data-col="controller-braking">
                braking
              </th>
              <th scope="col" className={th} data-col="controller-throttle">
                throttle
              </th>
            </>
          ) : null}
          {rules.map((r, i) => (
            <th
              key={r.id}
              scope="col"
              className={`${th} ${i === 0 ? "border-l border-ink-200" : ""} ${ruleClass(i)}`}
              style={ruleStyle(i)}
              title={r.type === "require-drive" ? `Must drive: ${r.label}` : r.label}
              data-col={r.id}
            >
              {labelled ? (
                <Heading label={r.label} id={r.id} extra={r.type === "require-drive" ? "must drive" : undefined} />
              ) : (
                <>
                  {r.id}
                  {r.type === "require-drive" ? <span className="font-normal text-ink-400"> must drive</span> : null}
                </>
              )}
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
              // Opaque colours only: the sticky cells inherit them, and a see-through one shows the scrolled text.
              className={`${isSelected ? "bg-copper-50" : bad ? "bg-brick-50" : "odd:bg-white even:bg-ink-50"} ${onSelect ? "cursor-pointer hover:bg-copper-100" : ""}`}
              onClick={onSelect ? () => onSelect(r.index) : undefined}
            >
              <th
                scope="row"
                className={`${td} border-r border-ink-100 text-right font-semibold text-ink-700 ${sticky ? "sticky left-0 bg-inherit" : ""}`}
              >
                {onSelect ? (
                  <Button
                    type="button"
                    variant="quiet-link"
                    size="text"
                    onClick={(e) => {
                      e.stopPropagation();
                      onSelect(r.index);
                    }}
                    aria-label={`Row ${r.index}: open its diagnosis`}
                  >
                    {r.index}
                  </Button>
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
                <td className={`${td} ${pinRight ? `${driveClass} bg-inherit` : ""}`} style={driveStyle}>
                  <DriveCell drive={r.drive} />
                </td>
              ) : null}
              {pinSummary && showDrive ? (
                <td
                  className={`${dense ? "px-1 py-0" : "px-2 py-1"} ${stickyRight} bg-inherit text-[11px] leading-tight`}
                  style={summaryStyle}
                  data-testid="rules-summary"
                >
                  <RulesInRow columns={rules} cells={r.rules} />
                </td>
              ) : null}
              {pick(r.rules, band?.rules).map((c, i) => (
                <td
                  key={`r${i}`}
                  className={`${td} ${pinRules ? `${ruleClass(i).replace("z-20", "")} bg-inherit` : ""}`}
                  style={ruleStyle(i)}
                >
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

/**
 * One row's rules in a few words: the ones it breaks (an inhibit rule violated, a must-drive rule
 * failing), else the ones that apply to it (unsafe for an inhibit rule, demanding drive).
 */
function RulesInRow({ columns, cells }: { columns: Array<{ id: string; label: string }>; cells: RuleCell[] }) {
  const named = (...kinds: RuleCell[]) => columns.filter((_, i) => kinds.includes(cells[i]!));
  const broken = named("violating", "failing");
  const unsafe = named("unsafe");
  const demand = named("demand");
  const list = (rs: Array<{ id: string; label: string }>) => rs.map((x) => x.id).join(", ");
  const title = (rs: Array<{ id: string; label: string }>) => rs.map((x) => x.label || x.id).join("; ");
  if (broken.length > 0) {
    return (
      <span className="font-semibold text-brick-700" title={title(broken)}>
        <span aria-hidden="true">✕ </span>breaks {list(broken)}
      </span>
    );
  }
  if (unsafe.length + demand.length > 0) {
    return (
      <span className="text-copper-700" title={title([...unsafe, ...demand])}>
        {unsafe.length > 0 ? (
          <span className="block">
            <span aria-hidden="true">▲ </span>unsafe for {list(unsafe)}
          </span>
        ) : null}
        {demand.length > 0 ? (
          <span className="block">
            <span aria-hidden="true">▷ </span>must drive for {list(demand)}
          </span>
        ) : null}
      </span>
    );
  }
  return <span className="text-ink-500">none applies</span>;
}
