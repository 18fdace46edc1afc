// The mark of a vehicle whose released proof does not hold for its controller settings record, with the
// exact difference in words. Shown on the vehicle list, the vehicle page, "why won't it drive" and home.
import { Link } from "react-router";
import { PROOF_DOES_NOT_HOLD } from "~/vehicles/controller-status";

export function ProofMark({ differences, to, compact = false }: { differences: string[]; to?: string; compact?: boolean }) {
  return (
    <div
      role="alert"
      data-testid="proof-mark"
      className={`rounded-md border-2 border-brick-600 bg-brick-50 text-brick-700 ${compact ? "mt-2 p-2 text-xs" : "p-4 text-sm"}`}
    >
      <p className="font-semibold">{PROOF_DOES_NOT_HOLD}.</p>
      <ul className={`${compact ? "mt-1" : "mt-2"} list-disc space-y-1 pl-5`}>
        {differences.map((d) => (
          <li key={d}>{d}</li>
        ))}
      </ul>
      {to ? (
        <Link to={to} className="mt-2 inline-block font-semibold underline">
          See the controller settings
        </Link>
      ) : null}
    </div>
  );
}
