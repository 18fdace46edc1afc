// A link that looks like a button: for going somewhere (a URL changes), where <Button> would do something.
import { Link, type LinkProps } from "react-router";
import { buttonVariants, type ButtonVariants } from "./button";

export function ButtonLink({ layout, variant, size, className, ...rest }: LinkProps & ButtonVariants) {
  return <Link className={buttonVariants({ layout, variant, size, className })} {...rest} />;
}

/** A link in running text or a table: the action colour, underlined. */
export const textLink = "text-action-ink underline underline-offset-2 hover:text-action-hover";
