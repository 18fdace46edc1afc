// The design editor as the route mounts it. xyflow, elkjs and the proof worker only run in the
// browser, so the editor module is loaded after mount; the server renders a placeholder.
import { lazy, Suspense, useSyncExternalStore } from "react";
import type { DesignEditorProps } from "./contract";
import { cardVariants } from "../components/ui/card";

const Editor = lazy(() => import("./editor"));

function Placeholder() {
  return (
    <div
      role="status"
      className={cardVariants({
        padding: "none",
        className: "flex h-[60vh] min-h-[320px] items-center justify-center text-sm text-ink-500 md:h-auto md:min-h-[480px] md:flex-1",
      })}
    >
      Opening the canvas…
    </div>
  );
}

const noSubscription = () => () => {};

export function DesignEditor(props: DesignEditorProps) {
  // false while rendering on the server and hydrating, true in the browser afterwards
  const mounted = useSyncExternalStore(
    noSubscription,
    () => true,
    () => false,
  );
  if (!mounted) return <Placeholder />;
  return (
    <Suspense fallback={<Placeholder />}>
      <Editor {...props} />
    </Suspense>
  );
}

export type { DesignEditorProps };
