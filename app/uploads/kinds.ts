// What each file picker accepts, in one place for the picker's `accept` and for the server's check,
// so a refusal names exactly what the picker offered. No server imports: pages use it too.
export const FILE_TYPES = {
  "image/jpeg": "JPEG",
  "image/png": "PNG",
  "image/webp": "WebP",
  "application/pdf": "PDF",
} as const;

export type FileType = keyof typeof FILE_TYPES;

/** A vehicle's photos and documents. */
export const VEHICLE_FILES: readonly FileType[] = ["image/jpeg", "image/png", "image/webp", "application/pdf"];
/** A bench step's photos (taken at the bench: no documents). */
export const STEP_PHOTOS: readonly FileType[] = ["image/jpeg", "image/png", "image/webp"];

/** The picker's accept attribute. */
export const acceptOf = (types: readonly FileType[]) => types.join(",");

/** "JPEG, PNG, WebP or PDF" */
export function acceptedWords(types: readonly FileType[]): string {
  const names = types.map((t) => FILE_TYPES[t]);
  return names.length <= 1 ? names.join("") : `${names.slice(0, -1).join(", ")} or ${names[names.length - 1]}`;
}

/** The refusal of a file of another type, listing exactly what the picker accepts. */
export function refusalOf(types: readonly FileType[]): string {
  return `This file is not one of the accepted types. Accepted: ${acceptedWords(types)} files (checked by the file's content, not its name).`;
}

export const EMPTY_FILE = "The file is empty (0 bytes). Choose the file again; if it is a photo, take it again.";
