// Warns before leaving with unsaved changes: the browser's own prompt, and in-app navigation.
import { useContext, useEffect } from "react";
import { UNSAFE_DataRouterContext, useBlocker } from "react-router";

export function LeaveGuard({ dirty }: { dirty: boolean }) {
  useEffect(() => {
    if (!dirty) return;
    const warn = (e: BeforeUnloadEvent) => {
      e.preventDefault();
      e.returnValue = "";
    };
    window.addEventListener("beforeunload", warn);
    return () => window.removeEventListener("beforeunload", warn);
  }, [dirty]);
  // useBlocker needs a data router; the editor also runs outside one (tests, benchmarks).
  return useContext(UNSAFE_DataRouterContext) ? <RouterLeaveGuard dirty={dirty} /> : null;
}

function RouterLeaveGuard({ dirty }: { dirty: boolean }) {
  const blocker = useBlocker(({ currentLocation, nextLocation }) => dirty && currentLocation.pathname !== nextLocation.pathname);
  useEffect(() => {
    if (blocker.state !== "blocked") return;
    if (window.confirm("This design has changes that are not saved yet. Leave anyway?")) blocker.proceed();
    else blocker.reset();
  }, [blocker]);
  return null;
}
