// URLs of the reviewer's pages and the truth-table API, in one place.
import { designPath } from "~/designs/paths";

export const revisionPath = (ws: string, designId: string, number: number) => `${designPath(ws, designId)}/revisions/${number}`;
export const reviewPath = (ws: string, designId: string, number: number) => `${revisionPath(ws, designId, number)}/review`;
export const truthTablePath = (ws: string, designId: string, number: number) => `${revisionPath(ws, designId, number)}/table`;
export const reportPath = (ws: string, designId: string, number: number, size?: "a4" | "letter") =>
  `${revisionPath(ws, designId, number)}/report${size ? `?size=${size}` : ""}`;
export const reportPdfPath = (ws: string, designId: string, number: number, size: "a4" | "letter") =>
  `${revisionPath(ws, designId, number)}/report.pdf?size=${size}`;
export const reviewsPath = (ws: string) => `/w/${ws}/reviews`;

const apiRevision = (designId: string, number: number) => `/api/v1/designs/${designId}/revisions/${number}`;
/** A page of truth-table rows (JSON). */
export const rowsApiPath = (designId: string, number: number) => `${apiRevision(designId, number)}/rows`;
/** One row with the engine's diagnosis (JSON). */
export const rowApiPath = (designId: string, number: number, index: number) => `${apiRevision(designId, number)}/rows/${index}`;
/** The truth table as CSV, streamed. */
export const csvApiPath = (designId: string, number: number) => `${apiRevision(designId, number)}/table.csv`;

/**
 * The canvas editor simulating one truth-table row: `?revision=N&row=I` (decision 062). The editor
 * opens revision N read-only; `row` names the row index to simulate, for an editor that reads it.
 */
export const simulateRowPath = (ws: string, designId: string, number: number, row: number) =>
  `${designPath(ws, designId)}/edit?revision=${number}&row=${row}`;
