// The white, bordered box the pages are made of. cardVariants gives the look to an element that must
// stay what it is (a form, a link, a list item).
import type { HTMLAttributes, ReactNode } from "react";
import { cva, type VariantProps } from "class-variance-authority";

export const cardVariants = cva("rounded-lg border bg-surface", {
  variants: {
    // The border's colour: proven marks a box that states what must hold (a must-drive rule).
    edge: { line: "border-line", proven: "border-proven/40" },
    // Padding is a variant: a className adds classes, it does not override (no class merging).
    padding: { none: "", xs: "p-2", sm: "p-3", md: "p-4", lg: "p-5", snug: "px-4 py-3" },
    interactive: { true: "hover:border-caution", false: "" },
  },
  defaultVariants: { edge: "line", padding: "md", interactive: false },
});

export type CardProps = HTMLAttributes<HTMLElement> &
  VariantProps<typeof cardVariants> & { as?: "div" | "section" | "article" | "aside" | "li" };

export function Card({ as = "div", edge, padding, interactive, className, ...rest }: CardProps) {
  // Every allowed tag takes the same HTML attributes; the cast only spares TypeScript the union.
  const Tag = as as "div";
  return <Tag className={cardVariants({ edge, padding, interactive, className })} {...rest} />;
}

/** A card with a heading row (title, and something beside it such as a link) above its content. */
export function CardSection({
  title,
  aside,
  children,
  className,
  padding = "lg",
  ...rest
}: Omit<CardProps, "title"> & { title: string; aside?: ReactNode }) {
  return (
    <Card as="section" padding={padding} className={className} {...rest}>
      <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
        <h2 className="font-semibold">{title}</h2>
        {aside}
      </div>
      {children}
    </Card>
  );
}
