import { Link } from "react-router";
import useSWR from "swr";
import type { Route } from "./+types/outbox";
import { env } from "~/env.server";
import { recentMail } from "~/mail/outbox.server";
import { Logo } from "~/components/logo";
import { Button } from "~/components/ui/form";
import { api } from "~/api/endpoints";
import { apiFetcher, apiUrl } from "~/api/client";
import { cardVariants } from "~/components/ui/card";

export const meta: Route.MetaFunction = () => [{ title: "Outbox · Chainproof" }];

// The local mail catcher: every message the app sent while running locally. It stands in for the
// recipients' mailboxes, so it is open to everyone, and it does not exist when CHAINPROOF_LOCAL=0.
export async function loader(_: Route.LoaderArgs) {
  if (env.CHAINPROOF_LOCAL !== "1") throw new Response("Not found", { status: 404 });
  const mail = await recentMail();
  return { mail: mail.map((m) => ({ ...m, receivedAt: m.receivedAt.toISOString() })) };
}

const URL_PATTERN = /(https?:\/\/[^\s]+)/g;
const IS_URL = /^https?:\/\//;

function Body({ text }: { text: string }) {
  const parts = text.split(URL_PATTERN);
  return (
    <p className="whitespace-pre-wrap break-words text-sm text-ink-800">
      {parts.map((part, i) =>
        IS_URL.test(part) ? (
          <a key={i} href={part} className="font-medium text-copper-700 underline">
            {part}
          </a>
        ) : (
          <span key={i}>{part}</span>
        ),
      )}
    </p>
  );
}

const fetchOutbox = apiFetcher(api.outbox);

export default function Outbox({ loaderData }: Route.ComponentProps) {
  // Live: new mail appears without a reload (every 3 s, and when the tab regains focus).
  const { data, mutate } = useSWR(apiUrl(api.outbox), fetchOutbox, {
    fallbackData: loaderData,
    refreshInterval: 3000,
    revalidateOnFocus: true,
  });
  const mail = data?.mail ?? loaderData.mail;
  return (
    <main className="mx-auto max-w-3xl px-4 py-8">
      <div className="flex items-center justify-between">
        <Link to="/" className="text-ink-800">
          <Logo />
        </Link>
        <Button tone="secondary" onClick={() => void mutate()}>
          Refresh
        </Button>
      </div>
      <h1 className="mt-6 text-2xl font-semibold">Outbox</h1>
      <p className="mt-1 text-sm text-ink-600">
        Every message Chainproof sent while running locally, newest first. In production, mail goes to a real relay and this page does not
        exist.
      </p>
      {mail.length === 0 ? (
        <p className="mt-8 rounded-md border border-dashed border-ink-300 bg-white p-6 text-center text-sm text-ink-600">No mail yet.</p>
      ) : (
        <ul className="mt-6 space-y-4">
          {mail.map((m) => (
            <li key={m.id} className={cardVariants({ padding: "md" })} data-testid="mail">
              <div className="flex flex-wrap items-baseline justify-between gap-2">
                <h2 className="font-semibold">{m.subject}</h2>
                <time className="text-xs text-ink-500" dateTime={m.receivedAt}>
                  {new Date(m.receivedAt).toLocaleString("en-GB", { timeZone: "UTC" })} UTC
                </time>
              </div>
              <p className="mb-2 text-xs text-ink-600">To: {m.recipients}</p>
              <Body text={m.textBody} />
              {m.attachments ? (
                <ul className="mt-2 text-sm text-ink-700" data-testid="attachments">
                  {m.attachments.split("\n").map((a) => (
                    <li key={a}>Attached: {a}</li>
                  ))}
                </ul>
              ) : null}
            </li>
          ))}
        </ul>
      )}
    </main>
  );
}
