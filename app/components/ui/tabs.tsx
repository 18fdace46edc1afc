// Tabs: a row of buttons (role="tab") that switch one panel. The caller owns which tab is selected and
// ties each tab to its panel (id, aria-controls); the look follows aria-selected.
import type { ButtonHTMLAttributes, HTMLAttributes, Ref } from "react";
import { cva, type VariantProps } from "class-variance-authority";
import { cn } from "./cn";

export function TabList({ className, ...rest }: HTMLAttributes<HTMLDivElement>) {
  return <div role="tablist" className={cn("flex flex-wrap gap-0.5 border-b border-line bg-surface px-1 pt-1", className)} {...rest} />;
}

export const tabVariants = cva("rounded-t font-semibold", {
  variants: {
    selected: { true: "border-b-2 border-action text-action-ink", false: "text-ink-600 hover:text-ink-900" },
    size: { sm: "px-2 py-1 text-xs" },
  },
  defaultVariants: { selected: false, size: "sm" },
});

/** One tab. Not a submit button: type="button" is set. */
export function Tab({
  selected,
  size,
  className,
  ...rest
}: Omit<ButtonHTMLAttributes<HTMLButtonElement>, "aria-selected" | "role"> &
  VariantProps<typeof tabVariants> & { selected: boolean; ref?: Ref<HTMLButtonElement> }) {
  return <button type="button" role="tab" aria-selected={selected} className={tabVariants({ selected, size, className })} {...rest} />;
}
