// The props contract with the route that mounts the editor (types owned by app/designs/types.ts).
export type { DesignEditorProps, SaveDraftResult, SaveRevisionResult } from "../designs/types";
