// The app shell: navigation, workspace switcher, user menu, demo banner. Phone-first. A route
// whose handle says `{ layout: "canvas" }` (the design editor) gets the whole window: the
// navigation collapses to a rail of icons (it can be opened again) and the page fills the height.
import { useState, type ReactNode } from "react";
import { Form, Link, NavLink, useMatches, useNavigate } from "react-router";
import { Logo, LogoMark } from "./logo";
import { can, ROLE_LABELS, type Action, type Role } from "~/lib/roles";
import { Button } from "./ui/button";
import { cardVariants } from "./ui/card";

export type ShellProps = {
  workspace: { slug: string; name: string };
  workspaces: Array<{ slug: string; name: string; role: Role }>;
  user: { name: string; email: string };
  role: Role;
  demo: boolean;
  localMail: boolean;
  /** Review requests waiting for this reviewer's decision (reviewers only; null for other roles). */
  reviewsWaiting?: number | null;
  children: ReactNode;
};

const SECTIONS = [
  { to: "vehicles", label: "Vehicles", icon: "M3 13l2-5h10l2 5v3H3zM6 16v1.5M14 16v1.5M5.5 13h9" },
  { to: "designs", label: "Designs", icon: "M4 5h4v4H4zM12 11h4v4h-4zM8 7h3v6h1" },
  { to: "reviews", label: "Reviews", icon: "M4 4h12v9H9l-3 3v-3H4z" },
  { to: "activity", label: "Design activity", icon: "M3 10h3l2-5 4 10 2-5h3", needs: "design-events.read" as Action },
  { to: "bench-tests", label: "Bench tests", icon: "M5 4h10M7 4v5l-3 6a1 1 0 001 1.5h10a1 1 0 001-1.5l-3-6V4" },
  {
    to: "settings",
    label: "Settings",
    icon: "M10 7a3 3 0 100 6 3 3 0 000-6zM10 2v2M10 16v2M2 10h2M16 10h2M4.3 4.3l1.4 1.4M14.3 14.3l1.4 1.4M4.3 15.7l1.4-1.4M14.3 5.7l1.4-1.4",
  },
] as const;

function Icon({ d }: { d: string }) {
  return (
    <svg viewBox="0 0 20 20" className="h-5 w-5 flex-none" aria-hidden="true">
      <path d={d} fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" strokeLinejoin="round" />
    </svg>
  );
}

type NavProps = { slug: string; role: Role; reviewsWaiting?: number | null; onNavigate?: () => void; compact?: boolean };

/** The count of reviews waiting, on the Reviews link: a number beside it, a dot on the collapsed rail. */
function WaitingBadge({ n, compact }: { n: number; compact: boolean }) {
  const words = `${n} review${n === 1 ? "" : "s"} waiting for you`;
  return (
    <span
      data-testid="reviews-waiting-badge"
      title={words}
      className={
        compact
          ? "absolute right-1 top-1 min-w-4 rounded-full bg-copper-600 px-1 text-center text-[10px] font-semibold leading-4 text-white"
          : "ml-auto min-w-6 rounded-full bg-copper-600 px-2 text-center text-xs font-semibold leading-5 text-white"
      }
    >
      <span aria-hidden="true">{n > 99 ? "99+" : n}</span>
      <span className="sr-only">{words}</span>
    </span>
  );
}

function Nav({ slug, role, reviewsWaiting, onNavigate, compact = false }: NavProps) {
  const sections = SECTIONS.filter((s) => !("needs" in s) || can(role, s.needs));
  return (
    <nav aria-label="Sections">
      <ul className="space-y-1">
        {sections.map((s) => (
          <li key={s.to}>
            <NavLink
              to={`/w/${slug}/${s.to}`}
              onClick={onNavigate}
              title={compact ? s.label : undefined}
              className={({ isActive }) =>
                `relative flex min-h-11 items-center gap-3 rounded-md py-2 text-sm font-medium ${compact ? "justify-center px-2" : "px-3"} ${
                  isActive ? "bg-ink-800 text-white" : "text-ink-700 hover:bg-ink-100"
                }`
              }
            >
              <Icon d={s.icon} />
              <span className={compact ? "sr-only" : undefined}>{s.label}</span>
              {s.to === "reviews" && reviewsWaiting ? <WaitingBadge n={reviewsWaiting} compact={compact} /> : null}
            </NavLink>
          </li>
        ))}
      </ul>
    </nav>
  );
}

function WorkspaceSwitcher({ current, workspaces }: { current: string; workspaces: ShellProps["workspaces"] }) {
  const navigate = useNavigate();
  return (
    <div>
      <label htmlFor="workspace-switcher" className="block text-xs font-medium uppercase tracking-wide text-ink-500">
        Workspace
      </label>
      <select
        id="workspace-switcher"
        value={current}
        onChange={(e) => navigate(`/w/${e.target.value}`)}
        className="mt-1 block w-full rounded-md border border-ink-300 bg-white px-2 py-2 text-sm"
      >
        {workspaces.map((w) => (
          <option key={w.slug} value={w.slug}>
            {w.name}
          </option>
        ))}
      </select>
    </div>
  );
}

function UserMenu({ user, role, side = "below" }: { user: ShellProps["user"]; role: Role; side?: "below" | "right" }) {
  return (
    <details className="group relative">
      <summary
        className="flex min-h-11 cursor-pointer list-none items-center gap-2 rounded-md px-2 py-1 hover:bg-ink-100"
        aria-label="Account menu"
      >
        <span
          className="flex h-8 w-8 items-center justify-center rounded-full bg-ink-800 text-sm font-semibold text-white"
          aria-hidden="true"
        >
          {user.name.slice(0, 1).toUpperCase()}
        </span>
        <span className={side === "right" ? "sr-only" : "hidden text-left text-sm sm:block"}>
          <span className="block font-medium leading-tight">{user.name}</span>
          <span className="block text-xs text-ink-500">{ROLE_LABELS[role]}</span>
        </span>
      </summary>
      <div
        className={cardVariants({
          padding: "sm",
          className: `absolute z-30 w-64 shadow-lg ${side === "right" ? "bottom-0 left-full ml-2" : "right-0 mt-2"}`,
        })}
      >
        <p className="text-sm font-medium">{user.name}</p>
        <p className="text-xs text-ink-600">{user.email}</p>
        <p className="mt-1 text-xs text-ink-600">Role here: {ROLE_LABELS[role]}</p>
        <Form method="post" action="/sign-out" className="mt-3">
          <Button type="submit" variant="secondary" className="w-full">
            Sign out
          </Button>
        </Form>
      </div>
    </details>
  );
}

/** True when the current route asks for the whole window (its handle: `{ layout: "canvas" }`). */
function useCanvasLayout(): boolean {
  return useMatches().some((m) => (m.handle as { layout?: string } | undefined)?.layout === "canvas");
}

export function Shell({ workspace, workspaces, user, role, demo, localMail, reviewsWaiting, children }: ShellProps) {
  const [open, setOpen] = useState(false);
  const canvas = useCanvasLayout();
  const [navOpen, setNavOpen] = useState(false);
  const rail = canvas && !navOpen;
  return (
    <div className={canvas ? "min-h-screen md:flex md:h-dvh md:flex-col" : "min-h-screen"}>
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:rounded focus:bg-white focus:px-3 focus:py-2"
      >
        Skip to content
      </a>
      {demo ? (
        <div className="bg-ink-800 px-4 py-2 text-center text-xs text-ink-100" role="note">
          Demo data: the example accounts (password <code>chainproof-demo</code>) are active in this installation.
          {localMail ? (
            <>
              {" "}
              Mail sent by the app is in the{" "}
              <Link to="/outbox" className="underline">
                outbox
              </Link>
              .
            </>
          ) : null}
        </div>
      ) : null}
      {/* On a phone the header scrolls away: only the page's own status bar stays on screen (decision 138). */}
      <header className="relative z-20 flex items-center justify-between border-b border-ink-200 bg-white/95 px-4 py-2 backdrop-blur md:hidden">
        <Button
          type="button"
          variant="ghost"
          size="icon"
          aria-expanded={open}
          aria-controls="mobile-nav"
          onClick={() => setOpen((o) => !o)}
        >
          <span className="sr-only">{open ? "Close menu" : "Open menu"}</span>
          <Icon d={open ? "M5 5l10 10M15 5L5 15" : "M3 6h14M3 10h14M3 14h14"} />
        </Button>
        <Link to={`/w/${workspace.slug}`} className="text-ink-800">
          <Logo />
        </Link>
        <UserMenu user={user} role={role} />
      </header>
      {open ? (
        <div id="mobile-nav" className="space-y-4 border-b border-ink-200 bg-white px-4 py-4 md:hidden">
          <WorkspaceSwitcher current={workspace.slug} workspaces={workspaces} />
          <Nav slug={workspace.slug} role={role} reviewsWaiting={reviewsWaiting} onNavigate={() => setOpen(false)} />
        </div>
      ) : null}
      <div className={canvas ? "md:flex md:min-h-0 md:flex-1" : "md:flex"}>
        {rail ? (
          <aside
            className="hidden w-14 flex-none flex-col items-center gap-4 border-r border-ink-200 bg-white px-1 py-3 md:flex"
            aria-label="Workspace navigation (collapsed)"
          >
            <Link to={`/w/${workspace.slug}`} className="text-ink-800" title={`${workspace.name}: home`}>
              <LogoMark />
              <span className="sr-only">Chainproof: {workspace.name}</span>
            </Link>
            <Button
              type="button"
              variant="ghost"
              size="icon"
              aria-expanded={false}
              onClick={() => setNavOpen(true)}
              title="Show the navigation"
            >
              <span className="sr-only">Show the navigation</span>
              <Icon d="M3 6h14M3 10h14M3 14h14" />
            </Button>
            <Nav slug={workspace.slug} role={role} reviewsWaiting={reviewsWaiting} compact />
            <div className="mt-auto">
              <UserMenu user={user} role={role} side="right" />
            </div>
          </aside>
        ) : (
          <aside
            className={`hidden w-60 flex-none flex-col gap-6 border-r border-ink-200 bg-white px-4 py-5 md:flex ${canvas ? "md:overflow-y-auto" : "md:min-h-screen"}`}
          >
            <div className="flex items-center justify-between gap-2">
              <Link to={`/w/${workspace.slug}`} className="text-ink-800">
                <Logo />
              </Link>
              {canvas ? (
                <Button type="button" variant="ghost" size="compact" aria-expanded={true} onClick={() => setNavOpen(false)}>
                  Hide
                </Button>
              ) : null}
            </div>
            <WorkspaceSwitcher current={workspace.slug} workspaces={workspaces} />
            <Nav slug={workspace.slug} role={role} reviewsWaiting={reviewsWaiting} />
            {canvas ? (
              <div className="mt-auto">
                <UserMenu user={user} role={role} side="right" />
              </div>
            ) : null}
          </aside>
        )}
        <div className={canvas ? "min-w-0 flex-1 md:flex md:min-h-0 md:flex-col" : "min-w-0 flex-1"}>
          {canvas ? null : (
            <div className="hidden items-center justify-end border-b border-ink-200 bg-white px-6 py-2 md:flex">
              <UserMenu user={user} role={role} />
            </div>
          )}
          <main
            id="main"
            className={canvas ? "px-3 py-3 md:flex md:min-h-0 md:flex-1 md:flex-col md:px-4" : "mx-auto max-w-6xl px-4 py-6 md:px-8"}
          >
            {children}
          </main>
        </div>
      </div>
    </div>
  );
}
