// URLs of the reviewer's pages and the truth-table API, in one place.
import { designPath } from "~/designs/paths";
import { api } from "~/api/endpoints";
import { apiUrl } from "~/api/client";

export const revisionPath = (ws: string, designId: string, number: number) => `${designPath(ws, designId)}/revisions/${number}`;
export const reviewPath = (ws: string, designId: string, number: number) => `${revisionPath(ws, designId, number)}/review`;
export const truthTablePath = (ws: string, designId: string, number: number) => `${revisionPath(ws, designId, number)}/table`;
/** `?size=…&compare=…`: the paper, and the revision the report compares with when the reviewer chose one. */
const reportQuery = (size?: "a4" | "letter", compare?: number | null) => {
  const q = new URLSearchParams();
  if (size) q.set("size", size);
  if (compare) q.set("compare", String(compare));
  const s = q.toString();
  return s ? `?${s}` : "";
};
export const reportPath = (ws: string, designId: string, number: number, size?: "a4" | "letter", compare?: number | null) =>
  `${revisionPath(ws, designId, number)}/report${reportQuery(size, compare)}`;
export const reportPdfPath = (ws: string, designId: string, number: number, size: "a4" | "letter", compare?: number | null) =>
  `${revisionPath(ws, designId, number)}/report.pdf${reportQuery(size, compare)}`;
export const reviewsPath = (ws: string) => `/w/${ws}/reviews`;

/** A page of truth-table rows (JSON). */
export const rowsApiPath = (designId: string, number: number) => apiUrl(api.revisionRows, { designId, number });
/** One row with the engine's diagnosis (JSON). */
export const rowApiPath = (designId: string, number: number, index: number) => apiUrl(api.revisionRow, { designId, number, index });
/** The truth table as CSV, streamed. */
export const csvApiPath = (designId: string, number: number) => apiUrl(api.revisionTableCsv, { designId, number });

/**
 * The canvas editor simulating one truth-table row: `?revision=N&row=I` (decision 062). The editor
 * opens revision N read-only; `row` names the row index to simulate, for an editor that reads it.
 */
export const simulateRowPath = (ws: string, designId: string, number: number, row: number) =>
  `${designPath(ws, designId)}/edit?revision=${number}&row=${row}`;
