// Buttons: one look per role (action, secondary, danger, ghost, link) and size, over the role-named
// colour tokens of app.css. Use <Button> for an action on this page and <ButtonLink> (link.tsx) to go
// somewhere; buttonVariants gives the same look to what must stay another element.
// No class merging: a className adds to the variant's classes, so change padding, colour or weight
// through a variant (or add one) rather than by overriding it.
import type { ButtonHTMLAttributes, Ref } from "react";
import { cva, type VariantProps } from "class-variance-authority";

export const buttonVariants = cva("transition-colors disabled:cursor-not-allowed aria-disabled:cursor-not-allowed", {
  variants: {
    // How the content sits: in a row (most buttons), a tighter row (a token with its ✕), or as a block
    // of its own lines (a button that is a small card, such as one step of a sequence).
    layout: {
      inline: "inline-flex items-center justify-center gap-2",
      tight: "inline-flex items-center justify-center gap-1",
      block: "block w-full text-left",
    },
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
      // A link-like control in dense data (a row number in a table): the text's colour, a light underline.
      "quiet-link": "underline decoration-line-strong underline-offset-2 hover:text-action-ink",
      // A removable filter or similar token: a white pill with a border.
      token: "border border-line-strong bg-surface hover:bg-subtle",
      // One of a list of small cards to pick from (the steps of a sequence); "option-current" is the one shown.
      option: "border border-line bg-surface hover:border-ink-400",
      "option-current": "border border-action bg-surface",
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
      "inline-strong": "p-0 text-sm font-semibold",
      // Takes the surrounding type and has no padding (a row number in a table).
      text: "",
      pill: "min-h-8 rounded-full px-2 text-xs",
      option: "rounded px-2 py-1.5 text-xs",
    },
  },
  defaultVariants: { layout: "inline", variant: "action", size: "md" },
});

export type ButtonVariants = VariantProps<typeof buttonVariants>;

export type ButtonProps = ButtonHTMLAttributes<HTMLButtonElement> & ButtonVariants & { ref?: Ref<HTMLButtonElement> };

/** A button. Like the element it is, it submits its form unless given type="button". */
export function Button({ layout, variant, size, className, ...rest }: ButtonProps) {
  return <button className={buttonVariants({ layout, variant, size, className })} {...rest} />;
}

export const chipVariants = cva(
  "inline-flex items-center justify-center border font-medium disabled:cursor-not-allowed aria-pressed:text-white",
  {
    variants: {
      pressed: { true: "", false: "border-line-strong bg-surface text-ink-700 hover:bg-subtle" },
      // action: a choice that changes what is shown; ink: a reading the user records; proven, failing and
      // skipped: the outcome of a check the user records (pass, fail, not done).
      tone: {
        action: "aria-pressed:border-action aria-pressed:bg-action",
        ink: "aria-pressed:border-ink-800 aria-pressed:bg-ink-800",
        proven: "aria-pressed:border-proven aria-pressed:bg-proven",
        failing: "aria-pressed:border-failing aria-pressed:bg-failing",
        skipped: "aria-pressed:border-ink-700 aria-pressed:bg-ink-700",
      },
      size: {
        sm: "rounded-full px-2 py-0.5 text-xs",
        touch: "min-h-12 min-w-20 rounded-md px-4 text-base",
        "touch-sm": "min-h-11 rounded-md px-2 text-base",
        // A grid of large outcome buttons at the bench: 48 px high, the width of their cell.
        bench: "min-h-12 rounded-md text-base font-semibold",
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
