// The fetcher of the truth-table views: JSON or an Error carrying the API's message.
export async function fetchJson<T>(url: string): Promise<T> {
  const res = await fetch(url, { headers: { accept: "application/json" } });
  const body = (await res.json().catch(() => null)) as { error?: { message?: string; fields?: Array<{ path: string; message: string }> } } | null;
  if (!res.ok) {
    const field = body?.error?.fields?.[0];
    throw new Error(field ? `${field.path}: ${field.message}` : (body?.error?.message ?? `The server answered ${res.status}.`));
  }
  return body as T;
}
