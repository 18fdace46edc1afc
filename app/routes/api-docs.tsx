// The API description, readable: every /api/v1 operation grouped by tag, with its parameters,
// request body and answers; JSON schemas drawn as an indented outline. Public, like the document
// it renders (GET /api/v1/openapi.json); no outside scripts.
import { Link } from "react-router";
import type { Route } from "./+types/api-docs";
import { openApiDocument } from "~/api/openapi.server";
import { Logo } from "~/components/logo";
import { cardVariants } from "~/components/ui/card";

export const meta: Route.MetaFunction = () => [{ title: "API · Chainproof" }];

export async function loader(_: Route.LoaderArgs) {
  // A plain JSON copy: the page only reads it.
  return { doc: JSON.parse(JSON.stringify(openApiDocument())) as ApiDoc };
}

type Schema = {
  $ref?: string;
  type?: string | string[];
  description?: string;
  format?: string;
  properties?: Record<string, Schema>;
  required?: string[];
  items?: Schema;
  additionalProperties?: Schema | boolean;
  anyOf?: Schema[];
  oneOf?: Schema[];
  allOf?: Schema[];
  enum?: unknown[];
  const?: unknown;
  minimum?: number;
  maximum?: number;
  minLength?: number;
  maxLength?: number;
  pattern?: string;
  default?: unknown;
  $defs?: Record<string, Schema>;
};
type Parameter = { name: string; in: string; required?: boolean; description?: string; schema?: Schema };
type Content = Record<string, { schema?: Schema }>;
type Operation = {
  tags?: string[];
  summary?: string;
  description?: string;
  parameters?: Parameter[];
  requestBody?: { content?: Content };
  responses?: Record<string, { description?: string; content?: Content }>;
  security?: unknown[];
};
type ApiDoc = {
  openapi: string;
  info: { title: string; version: string; description?: string };
  tags?: Array<{ name: string; description?: string }>;
  paths: Record<string, Record<string, Operation>>;
  components?: {
    schemas?: Record<string, Schema>;
    securitySchemes?: Record<string, { type: string; scheme?: string; in?: string; name?: string; description?: string }>;
  };
};

const METHODS = ["get", "post", "put", "patch", "delete"] as const;
const METHOD_STYLE: Record<string, string> = {
  get: "bg-moss-100 text-moss-700",
  post: "bg-copper-100 text-copper-700",
  put: "bg-ink-200 text-ink-800",
  patch: "bg-ink-200 text-ink-800",
  delete: "bg-brick-100 text-brick-700",
};

const slugOf = (s: string) =>
  s
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, "-")
    .replace(/^-|-$/g, "");

/** Resolves "#/components/schemas/X" (and "#/$defs/X" inside a component) to the schema and its name. */
function resolve(doc: ApiDoc, s: Schema, defs: Record<string, Schema>): { schema: Schema; name?: string } {
  if (!s.$ref) return { schema: s };
  const name = s.$ref.split("/").pop()!;
  const target = s.$ref.startsWith("#/components/schemas/") ? doc.components?.schemas?.[name] : defs[name];
  return { schema: target ?? {}, name };
}

function typeWords(s: Schema): string {
  if (s.const !== undefined) return JSON.stringify(s.const);
  if (s.enum) return s.enum.map((x) => JSON.stringify(x)).join(" | ");
  const t = Array.isArray(s.type) ? s.type.join(" | ") : s.type;
  if (t === "array") return "array";
  if (t === "object" && !s.properties && s.additionalProperties && typeof s.additionalProperties === "object") return "map";
  return [t ?? (s.anyOf || s.oneOf ? "one of" : "any"), s.format ? `(${s.format})` : ""].filter(Boolean).join(" ");
}

function limits(s: Schema): string {
  const out: string[] = [];
  if (s.minLength !== undefined) out.push(`≥ ${s.minLength} chars`);
  if (s.maxLength !== undefined) out.push(`≤ ${s.maxLength} chars`);
  // zod's safe-integer bounds on every whole number say nothing to a reader.
  if (s.minimum !== undefined && s.minimum !== -Number.MAX_SAFE_INTEGER) out.push(`≥ ${s.minimum}`);
  if (s.maximum !== undefined && s.maximum !== Number.MAX_SAFE_INTEGER) out.push(`≤ ${s.maximum}`);
  if (s.default !== undefined) out.push(`default ${JSON.stringify(s.default)}`);
  return out.join(", ");
}

/** One schema as an indented outline; a named schema seen higher up is shown by name only. */
function Outline({
  doc,
  schema,
  defs,
  seen,
  depth,
}: {
  doc: ApiDoc;
  schema: Schema;
  defs: Record<string, Schema>;
  seen: string[];
  depth: number;
}) {
  // "X or null" reads as X with "| null" after it.
  const either = schema.anyOf ?? schema.oneOf;
  if (either?.length === 2 && !schema.properties) {
    const other = either.find((v) => v.type !== "null");
    if (other && either.some((v) => v.type === "null")) {
      return (
        <span>
          <Outline
            doc={doc}
            schema={{ ...other, description: other.description ?? schema.description }}
            defs={defs}
            seen={seen}
            depth={depth}
          />
          <span className="ml-1 font-mono text-xs text-ink-500">| null</span>
        </span>
      );
    }
  }
  const { schema: s0, name } = resolve(doc, schema, defs);
  const s = s0.$ref ? resolve(doc, s0, { ...defs, ...(s0.$defs ?? {}) }).schema : s0;
  const innerDefs = { ...defs, ...(s.$defs ?? {}) };
  if (name && seen.includes(name)) return <span className="font-mono text-xs text-copper-700">{name} (above)</span>;
  const nextSeen = name ? [...seen, name] : seen;
  if (depth > 8) return <span className="text-xs text-ink-500">…</span>;
  const variants = s.anyOf ?? s.oneOf ?? s.allOf;
  const items = s.items;
  const map = !s.properties && s.additionalProperties && typeof s.additionalProperties === "object" ? s.additionalProperties : null;
  return (
    <span>
      <span className="font-mono text-xs text-ink-600">
        {name ? <span className="mr-1 font-semibold text-copper-700">{name}</span> : null}
        {typeWords(s)}
      </span>
      {limits(s) ? <span className="ml-2 text-xs text-ink-500">{limits(s)}</span> : null}
      {s.description ? <span className="ml-2 text-xs text-ink-700">{s.description}</span> : null}
      {s.properties ? (
        <ul className="ml-4 border-l border-ink-200 pl-3">
          {Object.entries(s.properties).map(([key, child]) => (
            <li key={key} className="py-0.5">
              <span className="font-mono text-sm font-semibold text-ink-900">{key}</span>
              {s.required?.includes(key) ? null : <span className="ml-1 text-xs text-ink-500">optional</span>}
              <span className="mx-1 text-ink-400">:</span>
              <Outline doc={doc} schema={child} defs={innerDefs} seen={nextSeen} depth={depth + 1} />
            </li>
          ))}
        </ul>
      ) : null}
      {items ? (
        <ul className="ml-4 border-l border-ink-200 pl-3">
          <li className="py-0.5">
            <span className="font-mono text-xs text-ink-500">each item: </span>
            <Outline doc={doc} schema={items} defs={innerDefs} seen={nextSeen} depth={depth + 1} />
          </li>
        </ul>
      ) : null}
      {map ? (
        <ul className="ml-4 border-l border-ink-200 pl-3">
          <li className="py-0.5">
            <span className="font-mono text-xs text-ink-500">each value: </span>
            <Outline doc={doc} schema={map} defs={innerDefs} seen={nextSeen} depth={depth + 1} />
          </li>
        </ul>
      ) : null}
      {variants ? (
        <ul className="ml-4 border-l border-ink-200 pl-3">
          {variants.map((v, i) => (
            <li key={i} className="py-0.5">
              <span className="font-mono text-xs text-ink-500">{s.allOf ? "and" : "or"}: </span>
              <Outline doc={doc} schema={v} defs={innerDefs} seen={nextSeen} depth={depth + 1} />
            </li>
          ))}
        </ul>
      ) : null}
    </span>
  );
}

function Bodies({ doc, content }: { doc: ApiDoc; content?: Content }) {
  if (!content) return null;
  return (
    <>
      {Object.entries(content).map(([type, c]) => (
        <div key={type} className="mt-1">
          <span className="rounded bg-ink-100 px-1.5 py-0.5 font-mono text-xs text-ink-700">{type}</span>
          {c.schema ? (
            <div className="mt-1 overflow-x-auto">
              <Outline doc={doc} schema={c.schema} defs={{}} seen={[]} depth={0} />
            </div>
          ) : null}
        </div>
      ))}
    </>
  );
}

function OperationCard({ doc, method, path, op }: { doc: ApiDoc; method: string; path: string; op: Operation }) {
  const id = `${method}-${slugOf(path)}`;
  return (
    <article id={id} className={cardVariants({ padding: "md" })} data-testid="operation">
      <h3 className="flex flex-wrap items-baseline gap-2">
        <span className={`rounded px-2 py-0.5 font-mono text-xs font-bold uppercase ${METHOD_STYLE[method] ?? ""}`}>{method}</span>
        <code className="break-all font-mono text-sm font-semibold">{path}</code>
        <span className="text-sm text-ink-700">{op.summary}</span>
      </h3>
      {op.description ? <p className="mt-2 text-sm text-ink-700">{op.description}</p> : null}
      {op.security && op.security.length === 0 ? <p className="mt-1 text-xs text-moss-700">No authentication needed.</p> : null}
      {op.parameters?.length ? (
        <section className="mt-3">
          <h4 className="text-xs font-medium uppercase tracking-wide text-ink-500">Parameters</h4>
          <ul className="mt-1 space-y-1">
            {op.parameters.map((p) => (
              <li key={`${p.in}-${p.name}`} className="text-sm">
                <span className="font-mono font-semibold">{p.name}</span>
                <span className="ml-1 text-xs text-ink-500">
                  in {p.in}
                  {p.required ? ", required" : ""}
                </span>
                <span className="mx-1 text-ink-400">:</span>
                {p.schema ? <Outline doc={doc} schema={p.schema} defs={{}} seen={[]} depth={0} /> : null}
                {p.description && p.description !== p.schema?.description ? (
                  <span className="ml-2 text-xs text-ink-700">{p.description}</span>
                ) : null}
              </li>
            ))}
          </ul>
        </section>
      ) : null}
      {op.requestBody ? (
        <section className="mt-3">
          <h4 className="text-xs font-medium uppercase tracking-wide text-ink-500">Request body</h4>
          <Bodies doc={doc} content={op.requestBody.content} />
        </section>
      ) : null}
      <section className="mt-3">
        <h4 className="text-xs font-medium uppercase tracking-wide text-ink-500">Responses</h4>
        <ul className="mt-1 space-y-2">
          {Object.entries(op.responses ?? {}).map(([status, r]) => (
            <li key={status} className="text-sm">
              {status.startsWith("2") ? (
                <details open>
                  <summary className="cursor-pointer">
                    <span className="font-mono font-semibold text-moss-700">{status}</span>{" "}
                    <span className="text-ink-700">{r.description}</span>
                  </summary>
                  <div className="ml-4">
                    <Bodies doc={doc} content={r.content} />
                  </div>
                </details>
              ) : (
                <p>
                  <span className="font-mono font-semibold text-brick-700">{status}</span>{" "}
                  <span className="text-ink-700">{r.description}</span>{" "}
                  <a href="#schema-Error" className="text-xs text-copper-700 underline">
                    Error
                  </a>
                </p>
              )}
            </li>
          ))}
        </ul>
      </section>
    </article>
  );
}

export default function ApiDocs({ loaderData }: Route.ComponentProps) {
  const { doc } = loaderData;
  const ops = Object.entries(doc.paths).flatMap(([path, item]) =>
    METHODS.filter((m) => item[m]).map((method) => ({ path, method, op: item[method]! })),
  );
  const tags = (doc.tags ?? []).map((t) => ({ ...t, ops: ops.filter((o) => o.op.tags?.[0] === t.name) })).filter((t) => t.ops.length > 0);
  const errorSchema = doc.components?.schemas?.Error;
  return (
    <main className="mx-auto max-w-5xl px-4 py-8">
      <div className="flex flex-wrap items-center justify-between gap-3">
        <Link to="/" className="text-ink-800">
          <Logo />
        </Link>
        <a
          href="/api/v1/openapi.json"
          className="inline-flex min-h-11 items-center rounded-md border border-ink-300 bg-white px-4 text-sm font-medium hover:bg-ink-100"
        >
          openapi.json
        </a>
      </div>
      <h1 className="mt-6 text-2xl font-semibold">
        {doc.info.title}{" "}
        <span className="text-base font-normal text-ink-500">
          v{doc.info.version} · OpenAPI {doc.openapi}
        </span>
      </h1>
      {doc.info.description ? <p className="mt-2 max-w-3xl text-sm text-ink-700">{doc.info.description}</p> : null}
      <div className="mt-6 grid gap-6 lg:grid-cols-[13rem_1fr]">
        <nav aria-label="Sections" className="lg:sticky lg:top-4 lg:self-start">
          <ul className="flex flex-wrap gap-2 text-sm lg:flex-col lg:gap-1">
            {tags.map((t) => (
              <li key={t.name}>
                <a href={`#${slugOf(t.name)}`} className="text-copper-700 underline">
                  {t.name}
                </a>{" "}
                <span className="text-xs text-ink-500">{t.ops.length}</span>
              </li>
            ))}
            <li>
              <a href="#authentication" className="text-copper-700 underline">
                Authentication
              </a>
            </li>
            <li>
              <a href="#schema-Error" className="text-copper-700 underline">
                Errors
              </a>
            </li>
          </ul>
        </nav>
        <div className="min-w-0 space-y-10">
          <section id="authentication">
            <h2 className="text-lg font-semibold">Authentication</h2>
            <ul className="mt-2 space-y-2 text-sm">
              {Object.entries(doc.components?.securitySchemes ?? {}).map(([name, s]) => (
                <li key={name} className={cardVariants({ padding: "sm" })}>
                  <span className="font-mono font-semibold">{name}</span>{" "}
                  <span className="text-xs text-ink-500">
                    {s.type === "http" ? `HTTP ${s.scheme}: Authorization: Bearer <key>` : `${s.in} ${s.name}`}
                  </span>
                  {s.description ? <p className="mt-1 text-ink-700">{s.description}</p> : null}
                </li>
              ))}
            </ul>
          </section>
          {tags.map((t) => (
            <section key={t.name} id={slugOf(t.name)}>
              <h2 className="text-lg font-semibold">{t.name}</h2>
              {t.description ? <p className="text-sm text-ink-600">{t.description}</p> : null}
              <div className="mt-3 space-y-4">
                {t.ops.map((o) => (
                  <OperationCard key={`${o.method} ${o.path}`} doc={doc} method={o.method} path={o.path} op={o.op} />
                ))}
              </div>
            </section>
          ))}
          {errorSchema ? (
            <section id="schema-Error">
              <h2 className="text-lg font-semibold">Errors</h2>
              <div className={cardVariants({ padding: "md", className: "mt-2" })}>
                <Outline doc={doc} schema={{ $ref: "#/components/schemas/Error" }} defs={{}} seen={[]} depth={0} />
              </div>
            </section>
          ) : null}
        </div>
      </div>
    </main>
  );
}
