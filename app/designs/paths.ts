// URLs of the design pages, in one place.
export const designsPath = (ws: string) => `/w/${ws}/designs`;
export const designPath = (ws: string, designId: string) => `${designsPath(ws)}/${designId}`;
/** The canvas editor; with a revision number it shows that revision, read-only. */
export const editorPath = (ws: string, designId: string, revision?: number) =>
  `${designPath(ws, designId)}/edit${revision ? `?revision=${revision}` : ""}`;
