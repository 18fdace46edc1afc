// The head of a printed table of the report: one bold column heading per name.
import { Th, THead } from "~/components/ui/table";

export function PaperHead({ columns }: { columns: string[] }) {
  return (
    <THead look="paper">
      <tr>
        {columns.map((c) => (
          <Th key={c} pad="paper" weight="bold">
            {c}
          </Th>
        ))}
      </tr>
    </THead>
  );
}
