// Archiving a design from its page: the notice an archived design's page shows (who, when, what still
// works), and the Archive / Bring back button with its confirmation (decision 167).
import { useId, useState } from "react";
import { Form, useNavigation } from "react-router";
import { Button } from "~/components/ui/button";
import { Dialog } from "~/components/ui/dialog";
import { Notice } from "~/components/ui/form";
import { When } from "~/designs/design-bits";

export type ArchivedView = { at: string; byName: string };

export function ArchivedNotice({ archived }: { archived: ArchivedView }) {
  return (
    <div className="mb-5" data-testid="archived-notice">
      <Notice tone="warning">
        <p className="font-semibold">
          Archived by {archived.byName || "a former member"}, <When iso={archived.at} />.
        </p>
        <p className="mt-1">
          Kept for audit: its revisions, truth tables, reviews and reports stay readable, and vehicles keep the revisions released to them.
          It is left out of the design lists and takes no new drafts, revisions or releases until it is brought back.
        </p>
      </Notice>
    </div>
  );
}

/**
 * The button that opens the confirmation; the form posts intent=archive or intent=restore to the page.
 * The page keys it by the archived state, so it comes back closed once the change is made.
 */
export function ArchiveControl({ designName, archived }: { designName: string; archived: boolean }) {
  const [open, setOpen] = useState(false);
  const formId = useId();
  const busy = useNavigation().state === "submitting";
  const intent = archived ? "restore" : "archive";
  return (
    <>
      <Button type="button" variant={archived ? "secondary" : "danger-quiet"} onClick={() => setOpen(true)}>
        {archived ? "Bring back from the archive" : "Archive"}
      </Button>
      <Dialog
        open={open}
        onClose={() => setOpen(false)}
        title={archived ? `Bring back “${designName}”?` : `Archive “${designName}”?`}
        actions={
          <>
            <Button type="button" variant="ghost" size="dense" onClick={() => setOpen(false)}>
              Cancel
            </Button>
            <Button type="submit" form={formId} variant={archived ? "action" : "danger"} size="dense" disabled={busy}>
              {archived ? "Bring it back" : "Archive the design"}
            </Button>
          </>
        }
      >
        <Form method="post" id={formId} className="space-y-2 text-sm text-ink-700">
          <input type="hidden" name="intent" value={intent} />
          {archived ? (
            <p>It shows in the design lists again, and engineers can save drafts and revisions and release it to vehicles.</p>
          ) : (
            <>
              <p>
                Nothing is deleted. Its revisions, truth tables, reviews, reports and releases stay readable, and vehicles keep what was
                released to them.
              </p>
              <p>It leaves the design lists and the release choices, and takes no new drafts or revisions. You can bring it back later.</p>
            </>
          )}
        </Form>
      </Dialog>
    </>
  );
}
