// A record's derived values and findings, in words and units.
import { CLASS_WORDS, type DerivedValues, type Finding } from "~/controller-record";

const fmt = (v: number, places: number) => v.toFixed(places);

export function DerivedValuesTable({ derived }: { derived: DerivedValues }) {
  const rows: [string, string][] = [
    [
      "Pack window (minimum, nominal, maximum)",
      `${fmt(derived.pack.minV, 2)} V, ${fmt(derived.pack.nominalV, 2)} V, ${fmt(derived.pack.maxV, 2)} V`,
    ],
    ["Battery current limit", `${fmt(derived.batteryCurrentA, 1)} A`],
    ["Motor current limit", `${fmt(derived.motorCurrentA, 1)} A`],
  ];
  if (derived.packContinuousA !== undefined) rows.push(["Pack continuous current", `${fmt(derived.packContinuousA, 1)} A`]);
  const p = derived.precharge;
  if (p) {
    rows.push(["Precharge time constant", `${fmt(p.tauMs, 1)} ms`]);
    rows.push(["Precharge to 95 % / 99 %", `${fmt(p.t95Ms, 1)} ms / ${fmt(p.t99Ms, 1)} ms`]);
    rows.push(["Inrush through the resistor, at the pack's maximum", `${fmt(p.inrushA, 1)} A`]);
    rows.push(["Energy in the resistor per precharge", `${fmt(p.energyJ, 2)} J`]);
    rows.push(["Charge reached when the contactor closes", `${(p.reachedAtDelay * 100).toFixed(1)} %`]);
  }
  const t = derived.throttle;
  rows.push(["Throttle at rest reads as", CLASS_WORDS[t.rest]]);
  rows.push(["Throttle fully applied reads as", CLASS_WORDS[t.full]]);
  rows.push(["An open signal wire (0 V) reads as", CLASS_WORDS[t.openSignal]]);
  if (t.openGround) rows.push(["An open ground wire (5 V) reads as", CLASS_WORDS[t.openGround]]);
  return (
    <dl className="grid gap-x-4 gap-y-2 text-sm sm:grid-cols-[auto_1fr]" data-testid="derived-values">
      {rows.map(([k, v]) => (
        <div key={k} className="contents">
          <dt className="text-ink-600">{k}</dt>
          <dd className="font-medium tabular-nums">{v}</dd>
        </div>
      ))}
    </dl>
  );
}

export function FindingList({ findings, empty }: { findings: Finding[]; empty: string }) {
  if (findings.length === 0) return <p className="text-sm text-moss-700">{empty}</p>;
  return (
    <ul className="space-y-2" data-testid="findings">
      {findings.map((f, i) => (
        <li
          key={`${f.code}-${i}`}
          className={`rounded-md border-l-4 px-3 py-2 text-sm ${f.severity === "error" ? "border-brick-600 bg-brick-50 text-brick-700" : "border-copper-500 bg-copper-50 text-copper-700"}`}
        >
          <span className="font-semibold">{f.severity === "error" ? "Error" : "Warning"}</span>: {f.message}
          <span className="block text-xs opacity-80">
            {f.code} · {f.path}
          </span>
        </li>
      ))}
    </ul>
  );
}
