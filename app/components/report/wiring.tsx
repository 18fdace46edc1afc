// The report's wiring: the diagram fitted to the paper (wide, or in one column; left out when its type
// would print under 6 pt, decision 166) and the wiring list, terminal to terminal, with each net.
import type { Design } from "~/engine";
import type { PaperDiagram } from "~/reviews/paper-diagram";
import { WiringDiagram } from "~/components/wiring-diagram";
import { Table, TBody, Td } from "~/components/ui/table";
import { PaperHead } from "./paper-head";
import { h2 } from "./paper";

export function ReportWiring({
  design,
  diagram,
  wiring,
  nets,
}: {
  design: Design;
  diagram: PaperDiagram | null;
  wiring: Array<{ from: string; to: string; net: number }>;
  /** The terminals of each net, by net number. */
  nets: string[][];
}) {
  return (
    <section className="break-before" aria-label="Wiring">
      <h2 className={h2}>Wiring diagram</h2>
      {diagram ? (
        <div className="break-inside-avoid" data-testid="report-diagram" data-layout={diagram.layout}>
          <div className="mx-auto mt-3 w-fit rounded border border-ink-200 p-2">
            <div style={{ width: diagram.widthPx }}>
              <WiringDiagram design={design} layout={diagram.layout} />
            </div>
          </div>
          <p className="mt-1 text-xs text-ink-600">
            Smallest type {diagram.smallestPt.toFixed(1)} pt
            {diagram.layout === "stacked" ? "; drawn in one column, in order of wire hops from the supply, to fit the page" : ""}. Labels
            longer than 22 characters are shortened here; the tables below give them in full.
          </p>
        </div>
      ) : (
        <p className="mt-2" data-testid="diagram-left-out">
          The diagram is left out: fitted to one page, wide or in one column, its labels would print smaller than 6 pt. The wiring list
          below gives every wire, terminal to terminal, with its net.
        </p>
      )}
      <h2 className={h2}>Wiring list</h2>
      <Table look="paper" className="mt-2 w-full" data-testid="wiring-list">
        <PaperHead columns={["#", "From terminal", "To terminal", "Net"]} />
        <TBody divided={false} className="font-mono text-xs">
          {wiring.map((w, i) => (
            <tr key={i} className="border-t border-ink-100">
              <Td pad="paper-dense">{i + 1}</Td>
              <Td pad="paper-dense">{w.from}</Td>
              <Td pad="paper-dense">{w.to}</Td>
              <Td pad="paper-dense">
                N{w.net} <span className="text-ink-500">({nets[w.net]?.join(", ")})</span>
              </Td>
            </tr>
          ))}
        </TBody>
      </Table>
    </section>
  );
}
