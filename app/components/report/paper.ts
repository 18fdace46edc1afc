// What every part of the printed report shares: the paper sizes it offers, its section heading and
// its way of writing a time (UTC, to the minute).
export const SIZES = { a4: "A4", letter: "Letter" } as const;
export type Size = keyof typeof SIZES;

export const h2 = "mt-8 break-after-avoid border-b-2 border-ink-800 pb-1 text-lg font-semibold";

export const iso = (s: string) => `${s.slice(0, 10)} ${s.slice(11, 16)} UTC`;
