// Buttons: one look per role (action, secondary, danger, ghost, link) and size, over the role-named
// colour tokens of app.css. Use <Button> for an action on this page and <ButtonLink> (link.tsx) to go
// somewhere; buttonVariants gives the same look to what must stay another element.
// No class merging: a className adds to the variant's classes, so change padding, colour or weight
// through a variant (or add one) rather than by overriding it.
import type { ButtonHTMLAttributes, Ref } from "react";
import { cva, type VariantProps } from "class-variance-authority";

export const buttonVariants = cva(
  "inline-flex items-center justify-center gap-2 transition-colors disabled:cursor-not-allowed aria-disabled:cursor-not-allowed",
  {
    variants: {
      variant: {
        action: "bg-action text-white shadow-sm hover:bg-action-hover disabled:bg-ink-300",
        secondary:
          "border border-line-strong bg-surface text-ink-800 shadow-sm hover:bg-subtle disabled:text-ink-400 disabled:hover:bg-surface",
        danger: "bg-failing text-white shadow-sm hover:bg-failing-hover disabled:bg-ink-300",
        "danger-quiet": "border border-failing bg-surface text-failing-ink hover:bg-failing-soft disabled:text-ink-400",
        // In a coloured banner: takes the banner's text colour.
        outline: "border border-current hover:bg-surface/60",
        // Takes the surrounding text colour (a dismiss cross in a note).
        bare: "hover:opacity-70",
        ghost: "text-ink-700 hover:bg-subtle disabled:text-ink-300 disabled:hover:bg-transparent",
        link: "text-action-ink underline underline-offset-2 hover:text-action-hover disabled:text-ink-400",
      },
      size: {
        md: "min-h-10 rounded-md px-4 py-2 text-sm font-semibold",
        lg: "min-h-12 rounded-md px-4 py-2 text-base font-semibold",
        dense: "min-h-9 rounded-md px-3 py-1.5 text-sm font-semibold",
        sm: "rounded px-2 py-1 text-sm font-medium",
        xs: "rounded px-2 py-0.5 text-xs font-semibold",
        compact: "gap-1 rounded px-2 py-1 text-xs font-semibold",
        touch: "min-h-11 rounded-md px-3 text-sm font-medium",
        // Phone screens where people act on results (the why page, the bench): 16 px text.
        "touch-base": "min-h-11 rounded-md px-3 text-base font-medium",
        // For a phone at the bench: 44 px high, 16 px text.
        bench: "min-h-11 rounded-md px-4 text-base font-semibold",
        icon: "min-h-11 min-w-11 rounded-md",
        // For the link variant inside running text.
        inline: "p-0 text-sm",
      },
    },
    defaultVariants: { variant: "action", size: "md" },
  },
);

export type ButtonVariants = VariantProps<typeof buttonVariants>;

export type ButtonProps = ButtonHTMLAttributes<HTMLButtonElement> & ButtonVariants & { ref?: Ref<HTMLButtonElement> };

/** A button. Like the element it is, it submits its form unless given type="button". */
export function Button({ variant, size, className, ...rest }: ButtonProps) {
  return <button className={buttonVariants({ variant, size, className })} {...rest} />;
}

export const chipVariants = cva(
  "inline-flex items-center justify-center border font-medium disabled:cursor-not-allowed aria-pressed:text-white",
  {
    variants: {
      pressed: { true: "", false: "border-line-strong bg-surface text-ink-700 hover:bg-subtle" },
      // action: a choice that changes what is shown; ink: a reading the user records.
      tone: { action: "aria-pressed:border-action aria-pressed:bg-action", ink: "aria-pressed:border-ink-800 aria-pressed:bg-ink-800" },
      size: {
        sm: "rounded-full px-2 py-0.5 text-xs",
        touch: "min-h-12 min-w-20 rounded-md px-4 text-base",
        "touch-sm": "min-h-11 rounded-md px-2 text-base",
      },
    },
    defaultVariants: { pressed: false, tone: "action", size: "sm" },
  },
);

/** A toggle in a row of choices (aria-pressed): a state picked, a filter on. */
export function Chip({
  pressed,
  tone,
  size,
  className,
  ...rest
}: Omit<ButtonHTMLAttributes<HTMLButtonElement>, "aria-pressed"> &
  VariantProps<typeof chipVariants> & { pressed: boolean; ref?: Ref<HTMLButtonElement> }) {
  return <button type="button" aria-pressed={pressed} className={chipVariants({ pressed, tone, size, className })} {...rest} />;
}
