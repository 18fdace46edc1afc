// Table primitives: a head of small capitals, rows divided by a hairline, cells padded alike.
// `edge` pads the first and last column to line up with a card's padding (p-5) when the table bleeds.
import type { HTMLAttributes, TdHTMLAttributes, ThHTMLAttributes } from "react";
import { cva, type VariantProps } from "class-variance-authority";
import { cn } from "./cn";

export function Table({ className, ...rest }: HTMLAttributes<HTMLTableElement>) {
  return <table className={cn("min-w-full text-left text-sm", className)} {...rest} />;
}

/** Lets a wide table scroll sideways inside its card instead of widening the page. */
export function TableScroll({ className, ...rest }: HTMLAttributes<HTMLDivElement>) {
  return <div className={cn("relative overflow-x-auto", className)} {...rest} />;
}

export function THead({ className, ...rest }: HTMLAttributes<HTMLTableSectionElement>) {
  return <thead className={cn("border-b border-line text-xs uppercase tracking-wide text-muted", className)} {...rest} />;
}

export function TBody({ className, ...rest }: HTMLAttributes<HTMLTableSectionElement>) {
  return <tbody className={cn("divide-y divide-ink-100", className)} {...rest} />;
}

export const cellVariants = cva("", {
  variants: {
    pad: { md: "px-3 py-2", edge: "px-5 py-2", tight: "px-2 py-1", none: "" },
  },
  defaultVariants: { pad: "md" },
});

type CellVariants = VariantProps<typeof cellVariants>;

export function Th({ pad, className, scope = "col", ...rest }: ThHTMLAttributes<HTMLTableCellElement> & CellVariants) {
  return <th scope={scope} className={cellVariants({ pad, className: cn("font-medium", className) })} {...rest} />;
}

export function Td({ pad, className, ...rest }: TdHTMLAttributes<HTMLTableCellElement> & CellVariants) {
  return <td className={cellVariants({ pad, className })} {...rest} />;
}
