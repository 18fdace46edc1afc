// Form posts of our own pages go through better-auth's HTTP handler, so its rate limits,
// origin checks and cookies apply exactly as to any other client.
import { auth, CLIENT_IP_HEADER } from "./auth.server";
import { env } from "~/env.server";

export async function callAuth(request: Request, path: string, body: unknown): Promise<Response> {
  const headers = new Headers({ "content-type": "application/json", origin: new URL(env.APP_URL).origin });
  for (const name of ["cookie", "user-agent", CLIENT_IP_HEADER]) {
    const value = request.headers.get(name);
    if (value) headers.set(name, value);
  }
  return auth.handler(new Request(new URL(`/api/auth${path}`, env.APP_URL), { method: "POST", headers, body: JSON.stringify(body) }));
}

/** The Set-Cookie headers of a better-auth response, to pass on with a redirect. */
export function cookiesOf(response: Response): Headers {
  const headers = new Headers();
  for (const cookie of response.headers.getSetCookie()) headers.append("set-cookie", cookie);
  return headers;
}

export async function authErrorMessage(response: Response): Promise<{ code: string; message: string }> {
  if (response.status === 429) return { code: "rate_limited", message: "Too many attempts. Wait a minute and try again." };
  try {
    const body = (await response.json()) as { code?: string; message?: string };
    return { code: body.code ?? "error", message: body.message ?? "That did not work." };
  } catch {
    return { code: "error", message: "That did not work." };
  }
}
