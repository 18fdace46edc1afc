// A short status word in a pill. Colour only repeats what the word says (and a mark, where there is one).
import type { HTMLAttributes } from "react";
import { cva, type VariantProps } from "class-variance-authority";

export const badgeVariants = cva("inline-flex items-center gap-1 rounded-full font-semibold", {
  variants: {
    tone: {
      neutral: "border border-line-strong bg-subtle text-ink-700",
      plain: "border border-line-strong bg-surface text-ink-700",
      proven: "border border-proven/40 bg-proven-soft text-proven-ink",
      failing: "border border-failing/50 bg-failing-soft text-failing-ink",
      caution: "border border-caution/50 bg-caution-soft text-caution-ink",
      draft: "border border-dashed border-caution bg-caution-soft text-caution-ink",
      "failing-solid": "bg-failing text-white",
      "proven-solid": "bg-proven text-white",
      "caution-quiet": "bg-copper-100 text-caution-ink",
      quiet: "bg-subtle font-medium text-ink-800",
    },
    size: { sm: "px-2 py-0.5 text-xs", md: "px-3 py-1 text-sm", xs: "px-1.5 text-[10px]" },
  },
  defaultVariants: { tone: "neutral", size: "sm" },
});

export type BadgeProps = HTMLAttributes<HTMLSpanElement> & VariantProps<typeof badgeVariants>;

export function Badge({ tone, size, className, ...rest }: BadgeProps) {
  return <span className={badgeVariants({ tone, size, className })} {...rest} />;
}
