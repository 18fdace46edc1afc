// A modal dialog on the browser's own <dialog> (focus trapped, Escape closes, the page behind inert),
// opened and closed by its `open` prop. Where showModal is missing (jsdom), it opens without the modality.
import { useEffect, useId, useRef, type ReactNode } from "react";
import { cn } from "./cn";

export type DialogProps = {
  open: boolean;
  /** Escape, the close button of a form method="dialog", or an action of the caller. */
  onClose: () => void;
  title: ReactNode;
  /** The buttons at the bottom, right-aligned. */
  actions?: ReactNode;
  children?: ReactNode;
  className?: string;
};

export function Dialog({ open, onClose, title, actions, children, className }: DialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();
  useEffect(() => {
    const d = ref.current;
    if (!d) return;
    if (open && !d.open) {
      if (typeof d.showModal === "function") d.showModal();
      else d.setAttribute("open", "");
    } else if (!open && d.open) {
      if (typeof d.close === "function") d.close();
      else d.removeAttribute("open");
    }
  }, [open]);
  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      // The caller owns `open`: Escape asks it to close rather than closing behind its back.
      onCancel={(e) => {
        e.preventDefault();
        onClose();
      }}
      onKeyDown={(e) => {
        if (e.key === "Escape" && typeof ref.current?.showModal !== "function") onClose();
      }}
      className={cn(
        "m-auto max-h-[80vh] w-full max-w-lg overflow-y-auto rounded-lg bg-surface p-4 text-ink-900 shadow-xl backdrop:bg-ink-900/40",
        className,
      )}
    >
      {open ? (
        <>
          <h2 id={titleId} className="text-base font-semibold [overflow-wrap:anywhere]">
            {title}
          </h2>
          {children ? <div className="mt-2">{children}</div> : null}
          {actions ? <div className="mt-3 flex flex-wrap justify-end gap-2">{actions}</div> : null}
        </>
      ) : null}
    </dialog>
  );
}
