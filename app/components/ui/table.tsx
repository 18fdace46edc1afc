// Table primitives: a head of small capitals, rows divided by a hairline, cells padded alike.
// `edge` pads the first and last column to line up with a card's padding (p-5) when the table bleeds;
// `list` and `paper` pad only between columns, for a table in running text or on paper (the report).
import type { HTMLAttributes, TdHTMLAttributes, ThHTMLAttributes } from "react";
import { cva, type VariantProps } from "class-variance-authority";
import { cn } from "./cn";

export const tableVariants = cva("min-w-full text-left", {
  variants: {
    // paper: the report's type and leading, as set around the table.
    look: { screen: "text-sm", paper: "" },
  },
  defaultVariants: { look: "screen" },
});

export function Table({ look, className, ...rest }: HTMLAttributes<HTMLTableElement> & VariantProps<typeof tableVariants>) {
  return <table className={tableVariants({ look, className })} {...rest} />;
}

/** Lets a wide table scroll sideways inside its card instead of widening the page. */
export function TableScroll({ className, ...rest }: HTMLAttributes<HTMLDivElement>) {
  return <div className={cn("relative overflow-x-auto", className)} {...rest} />;
}

export const theadVariants = cva("text-xs uppercase text-muted", {
  variants: {
    // paper: no rule under the head (each printed row draws its own above it), no letter spacing.
    look: { screen: "border-b border-line tracking-wide", paper: "" },
  },
  defaultVariants: { look: "screen" },
});

export function THead({ look, className, ...rest }: HTMLAttributes<HTMLTableSectionElement> & VariantProps<typeof theadVariants>) {
  return <thead className={theadVariants({ look, className })} {...rest} />;
}

export const tbodyVariants = cva("", {
  variants: {
    // false where the rows draw their own rules (the report's printed rows).
    divided: { true: "divide-y divide-ink-100", false: "" },
  },
  defaultVariants: { divided: true },
});

export function TBody({ divided, className, ...rest }: HTMLAttributes<HTMLTableSectionElement> & VariantProps<typeof tbodyVariants>) {
  return <tbody className={tbodyVariants({ divided, className })} {...rest} />;
}

export const cellVariants = cva("", {
  variants: {
    pad: {
      md: "px-3 py-2",
      edge: "px-5 py-2",
      tight: "px-2 py-1",
      list: "py-1 pr-3 last:pr-0",
      paper: "py-1 pr-2 last:pr-0",
      "paper-dense": "py-0.5 pr-2 last:pr-0",
      none: "",
    },
  },
  defaultVariants: { pad: "md" },
});

type CellVariants = VariantProps<typeof cellVariants>;

const weights = { medium: "font-medium", bold: "font-bold" } as const;

/** A header cell, of a column by default (scope="row" for a row's); medium weight on screen, bold on paper. */
export function Th({
  pad,
  weight = "medium",
  className,
  scope = "col",
  ...rest
}: ThHTMLAttributes<HTMLTableCellElement> & CellVariants & { weight?: keyof typeof weights }) {
  return <th scope={scope} className={cellVariants({ pad, className: cn(weights[weight], className) })} {...rest} />;
}

export function Td({ pad, className, ...rest }: TdHTMLAttributes<HTMLTableCellElement> & CellVariants) {
  return <td className={cellVariants({ pad, className })} {...rest} />;
}
