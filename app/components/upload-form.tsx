// A file picker that posts to the current route's action with an intent; shows the field error.
import { Form, useNavigation } from "react-router";
import { Button } from "./ui/form";

export function UploadForm({ intent, label, accept, error }: { intent: string; label: string; accept: string; error?: string }) {
  const busy = useNavigation().state === "submitting";
  return (
    <Form method="post" encType="multipart/form-data" className="flex flex-wrap items-end gap-3">
      <input type="hidden" name="intent" value={intent} />
      <div>
        <label htmlFor={`upload-${intent}`} className="block text-sm font-medium text-ink-700">
          {label}
        </label>
        <input
          id={`upload-${intent}`}
          name="file"
          type="file"
          accept={accept}
          required
          aria-invalid={error ? true : undefined}
          className="mt-1 block w-full text-sm file:mr-3 file:min-h-10 file:rounded-md file:border-0 file:bg-ink-100 file:px-3 file:py-2 file:font-medium"
        />
      </div>
      <Button type="submit" tone="secondary" disabled={busy}>
        {busy ? "Uploading…" : "Upload"}
      </Button>
      {error ? (
        <p className="w-full text-sm text-brick-700" role="alert">
          {error}
        </p>
      ) : null}
    </Form>
  );
}
