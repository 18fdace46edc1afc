// Demo data of our own invented scenario: Larkspur Light Vehicles, a small maker of electric utility
// vehicles, with four people (one per role), four vehicles and a design for three. Runs only on an
// empty database; `tsx drizzle/seed.ts --designs` adds the demo designs to an existing demo
// workspace that has none, `--release` approves and releases the demo revision to its vehicle, and
// `--controller-records` adds the controller settings records (and hauler #5 with its release).
import { readFileSync } from "node:fs";
import { and, eq, sql } from "drizzle-orm";
import { drizzle, type NodePgDatabase } from "drizzle-orm/node-postgres";
import pg from "pg";
import { hashPassword } from "better-auth/crypto";
import * as schema from "../app/db/schema.server";
import { contentHash } from "../app/designs/content-hash.server";
import { checkDraft, proveDocument } from "../app/designs/proof";

export const DEMO_PASSWORD = "chainproof-demo";
export const DEMO_USERS = [
  { email: "admin@example.com", name: "Ines Calder", role: "admin" },
  { email: "engineer@example.com", name: "Tomas Ruelle", role: "engineer" },
  { email: "technician@example.com", name: "Priya Nandakumar", role: "technician" },
  { email: "reviewer@example.com", name: "Odile Ferrand", role: "reviewer" },
] as const;

export const DEMO_WORKSPACE = { slug: "larkspur", name: "Larkspur Light Vehicles" };

const VEHICLES = [
  {
    name: "Haybarn campus hauler #3",
    serial: "LLV-CH-0003",
    model: "Haybarn CH-2 utility cart",
    controllerDescription: "48 V series-wound drive controller, key power line, seat and charge-inlet contacts in the enable line.",
    notes: "Grounds crew vehicle. Charge inlet behind the rear-left panel.",
  },
  {
    name: "Meadowline deck mower M-11",
    serial: "LLV-DM-0011",
    model: "Meadowline ride-on deck mower",
    controllerDescription: "36 V drive controller with forward/reverse lever and park-brake input.",
    notes: "Pilot unit at the sports field.",
  },
  {
    name: "Haybarn campus hauler #5",
    serial: "LLV-CH-0005",
    model: "Haybarn CH-2 utility cart",
    controllerDescription: "48 V series-wound drive controller (replacement unit fitted in November), same loom as hauler #3.",
    notes: "Maintenance crew vehicle. Runs the hauler #3 design.",
  },
  {
    name: "Scree trail bike prototype P2",
    serial: "LLV-TB-P002",
    model: "Scree lightweight trail bike",
    controllerDescription: "72 V hub-motor controller; twist grip with fault detection; kill switch and side-stand contact.",
    notes: "Prototype; side-stand switch replaced in October.",
  },
];

export async function seed(databaseUrl: string, log: (s: string) => void = console.log) {
  const pool = new pg.Pool({ connectionString: databaseUrl, max: 2 });
  const db = drizzle(pool, { schema });
  try {
    const users = await db.select({ n: sql<number>`count(*)::int` }).from(schema.user);
    if ((users[0]?.n ?? 0) > 0) return false;
    const hash = await hashPassword(DEMO_PASSWORD);
    await db.transaction(async (tx) => {
      const workspaceId = crypto.randomUUID();
      await tx.insert(schema.workspace).values({ id: workspaceId, ...DEMO_WORKSPACE });
      for (const u of DEMO_USERS) {
        const userId = crypto.randomUUID();
        await tx.insert(schema.user).values({ id: userId, email: u.email, name: u.name, emailVerified: true });
        await tx
          .insert(schema.account)
          .values({ id: crypto.randomUUID(), accountId: userId, providerId: "credential", userId, password: hash });
        await tx.insert(schema.member).values({ id: crypto.randomUUID(), workspaceId, userId, role: u.role });
      }
      for (const v of VEHICLES) await tx.insert(schema.vehicle).values({ id: crypto.randomUUID(), workspaceId, ...v });
      await seedDemoDesigns(tx, workspaceId);
      await seedDemoRelease(tx, workspaceId);
      await seedDemoControllerRecords(tx, workspaceId);
    });
    log(`seeded the demo workspace "${DEMO_WORKSPACE.name}"`);
    return true;
  } finally {
    await pool.end();
  }
}

// Demo designs (docs/decisions/033). Only proven documents become revisions, so the mower's
// failing change and the trail bike's failing wiring are drafts.
const DEMO_DESIGNS = [
  {
    name: "Haybarn hauler #3, drive inhibit",
    vehicle: "Haybarn campus hauler #3",
    revisions: [
      {
        file: "haybarn-campus-hauler.json",
        message: "Key, seat, charge inlet and park brake; lockouts on power, enable, direction and brake",
      },
    ],
    draft: "haybarn-campus-hauler.json",
  },
  {
    name: "Meadowline M-11, drive inhibit",
    vehicle: "Meadowline deck mower M-11",
    revisions: [{ file: "meadowline-deck-mower.r1.json", message: "Charge inlet in the power line; direction lever and park brake" }],
    // Adds the seat switch to the enable line but not the enable-restore lockout: no-restart fails.
    draft: "meadowline-deck-mower.draft.json",
  },
  {
    name: "Scree P2, drive inhibit",
    vehicle: "Scree trail bike prototype P2",
    revisions: [],
    // The walk-mode button bridges the side-stand switch: the side-stand rule fails.
    draft: "scree-trail-bike.draft.json",
  },
];

type Seeder = Pick<NodePgDatabase<typeof schema>, "insert" | "select">;

function demoDocument(file: string): Record<string, unknown> {
  return JSON.parse(readFileSync(new URL(`./demo-designs/${file}`, import.meta.url), "utf8")) as Record<string, unknown>;
}

/** Adds the demo designs to the workspace when it has none; returns how many it added. */
export async function seedDemoDesigns(db: Seeder, workspaceId: string): Promise<number> {
  const existing = await db
    .select({ n: sql<number>`count(*)::int` })
    .from(schema.design)
    .where(eq(schema.design.workspaceId, workspaceId));
  if ((existing[0]?.n ?? 0) > 0) return 0;
  const author = await db
    .select({ id: schema.user.id })
    .from(schema.member)
    .innerJoin(schema.user, eq(schema.member.userId, schema.user.id))
    .where(and(eq(schema.member.workspaceId, workspaceId), eq(schema.user.email, DEMO_USERS[1].email)))
    .limit(1);
  if (!author[0]) throw new Error(`the demo engineer ${DEMO_USERS[1].email} is not a member of the workspace`);
  const authorId = author[0].id;
  const vehicles = await db
    .select({ id: schema.vehicle.id, name: schema.vehicle.name })
    .from(schema.vehicle)
    .where(eq(schema.vehicle.workspaceId, workspaceId));
  const day = 24 * 3600 * 1000;
  const now = Date.now();
  for (const d of DEMO_DESIGNS) {
    const designId = crypto.randomUUID();
    const vehicleId = vehicles.find((v) => v.name === d.vehicle)?.id ?? null;
    await db
      .insert(schema.design)
      .values({ id: designId, workspaceId, vehicleId, name: d.name, createdBy: authorId, createdAt: new Date(now - 3 * day) });
    let number = 0;
    for (const r of d.revisions) {
      const proof = proveDocument(demoDocument(r.file));
      if (!proof.ok || !proof.verdict.ok) throw new Error(`demo revision ${r.file} is not proven`);
      number += 1;
      await db.insert(schema.designRevision).values({
        id: crypto.randomUUID(),
        designId,
        workspaceId,
        number,
        document: proof.design,
        verdict: proof.verdict,
        contentHash: contentHash(proof.design),
        message: r.message,
        authorId,
        createdAt: new Date(now - 2 * day),
      });
    }
    const draft = demoDocument(d.draft);
    await db.insert(schema.designDraft).values({
      designId,
      workspaceId,
      version: 1,
      document: draft,
      contentHash: contentHash(draft),
      check: checkDraft(draft),
      baseRevision: number,
      updatedBy: authorId,
      updatedAt: new Date(now - day),
    });
  }
  return DEMO_DESIGNS.length;
}

/** For an installation seeded before designs existed: adds them to the demo workspace if it has none. */
export async function seedDesignsOnly(databaseUrl: string, log: (s: string) => void = console.log) {
  const pool = new pg.Pool({ connectionString: databaseUrl, max: 2 });
  const db = drizzle(pool, { schema });
  try {
    const ws = await db.select({ id: schema.workspace.id }).from(schema.workspace).where(eq(schema.workspace.slug, DEMO_WORKSPACE.slug));
    if (!ws[0]) return log(`no workspace "${DEMO_WORKSPACE.slug}"; nothing to do`);
    const added = await db.transaction((tx) => seedDemoDesigns(tx, ws[0]!.id));
    log(added ? `added ${added} demo designs` : "the demo workspace already has designs; nothing added");
  } finally {
    await pool.end();
  }
}

// The proven Haybarn revision, approved by the demo reviewer and released to its vehicle, so the
// technician pages (diagnosis, bench tests) have something to work on (docs/decisions/074).
const DEMO_RELEASE = { design: "Haybarn hauler #3, drive inhibit", vehicle: "Haybarn campus hauler #3", number: 1 };

/** How the demo hauler's defeating faults are dealt with (invented for the demo). */
const DEMO_DISPOSITIONS: Record<
  string,
  { disposition: "accepted" | "fix-next-revision" | "ruled-out"; justification: string; by: "engineer" | "reviewer" }
> = {
  BRK: {
    disposition: "accepted",
    by: "reviewer",
    justification: "Two-channel pedal switch; the controller compares both channels and stops on a mismatch.",
  },
  INLET: {
    disposition: "accepted",
    by: "engineer",
    justification: "The charger opens the pack contactor while its plug is in, independently of this switch.",
  },
  KEY: {
    disposition: "accepted",
    by: "engineer",
    justification: "The pack disconnect is within reach of the seat; the daily check turns the key off and confirms no drive.",
  },
  SEAT: {
    disposition: "fix-next-revision",
    by: "engineer",
    justification: "Revision 2 adds a second seat contact in series; until then the seat switch is checked at every service.",
  },
  "*": {
    disposition: "fix-next-revision",
    by: "engineer",
    justification: "A second contact in series follows in the next revision; checked at the daily pre-use check until then.",
  },
};

/** Approves and releases the demo revision when the vehicle has no release yet; returns whether it did. */
export async function seedDemoRelease(db: Seeder, workspaceId: string): Promise<boolean> {
  const rows = await db
    .select({
      revisionId: schema.designRevision.id,
      designId: schema.design.id,
      contentHash: schema.designRevision.contentHash,
      vehicleId: schema.vehicle.id,
    })
    .from(schema.designRevision)
    .innerJoin(schema.design, eq(schema.design.id, schema.designRevision.designId))
    .innerJoin(schema.vehicle, and(eq(schema.vehicle.workspaceId, workspaceId), eq(schema.vehicle.name, DEMO_RELEASE.vehicle)))
    .where(
      and(
        eq(schema.design.workspaceId, workspaceId),
        eq(schema.design.name, DEMO_RELEASE.design),
        eq(schema.designRevision.number, DEMO_RELEASE.number),
      ),
    )
    .limit(1);
  const r = rows[0];
  if (!r) return false;
  const released = await db
    .select({ id: schema.vehicleRelease.id })
    .from(schema.vehicleRelease)
    .where(eq(schema.vehicleRelease.vehicleId, r.vehicleId))
    .limit(1);
  if (released[0]) return false;
  const people = await db
    .select({ id: schema.user.id, email: schema.user.email })
    .from(schema.member)
    .innerJoin(schema.user, eq(schema.member.userId, schema.user.id))
    .where(eq(schema.member.workspaceId, workspaceId));
  const reviewer = people.find((p) => p.email === DEMO_USERS[3].email);
  const engineer = people.find((p) => p.email === DEMO_USERS[1].email);
  if (!reviewer || !engineer) throw new Error("the demo reviewer and engineer must be members of the workspace");
  const hour = 3600 * 1000;
  const now = Date.now();
  await db.insert(schema.reviewRequest).values({
    id: crypto.randomUUID(),
    workspaceId,
    designId: r.designId,
    revisionId: r.revisionId,
    reviewerId: reviewer.id,
    requestedBy: engineer.id,
    requestedAt: new Date(now - 30 * hour),
  });
  // Every single fault that defeats a rule is dealt with before approval (docs/decisions/161).
  const verdict = await db
    .select({ verdict: schema.designRevision.verdict })
    .from(schema.designRevision)
    .where(eq(schema.designRevision.id, r.revisionId));
  for (const [k, f] of (verdict[0]?.verdict.singleFaults ?? []).entries()) {
    const how = DEMO_DISPOSITIONS[f.component] ?? DEMO_DISPOSITIONS["*"]!;
    await db.insert(schema.faultDisposition).values({
      id: crypto.randomUUID(),
      workspaceId,
      designId: r.designId,
      revisionId: r.revisionId,
      contentHash: r.contentHash,
      component: f.component,
      mode: f.mode,
      disposition: how.disposition,
      justification: how.justification,
      authorId: how.by === "engineer" ? engineer.id : reviewer.id,
      createdAt: new Date(now - 27 * hour + k * 60_000),
    });
  }
  await db.insert(schema.reviewDecision).values({
    id: crypto.randomUUID(),
    workspaceId,
    designId: r.designId,
    revisionId: r.revisionId,
    reviewerId: reviewer.id,
    verdict: "approved",
    comment: "Checked the enable chain and the lockouts against the cart's wiring loom.",
    contentHash: r.contentHash,
    decidedAt: new Date(now - 26 * hour),
  });
  await db.insert(schema.vehicleRelease).values({
    id: crypto.randomUUID(),
    workspaceId,
    vehicleId: r.vehicleId,
    revisionId: r.revisionId,
    releasedBy: engineer.id,
    at: new Date(now - 24 * hour),
    note: "Loom rebuilt to revision 1.",
  });
  return true;
}

/** For an installation seeded before releases existed: approves and releases the demo revision. */
export async function seedReleaseOnly(databaseUrl: string, log: (s: string) => void = console.log) {
  const pool = new pg.Pool({ connectionString: databaseUrl, max: 2 });
  const db = drizzle(pool, { schema });
  try {
    const ws = await db.select({ id: schema.workspace.id }).from(schema.workspace).where(eq(schema.workspace.slug, DEMO_WORKSPACE.slug));
    if (!ws[0]) return log(`no workspace "${DEMO_WORKSPACE.slug}"; nothing to do`);
    const done = await db.transaction((tx) => seedDemoRelease(tx, ws[0]!.id));
    log(done ? "approved and released the demo revision" : "the demo vehicle already has a release (or no demo design); nothing done");
  } finally {
    await pool.end();
  }
}

// Controller settings records (docs/decisions/123): hauler #3's record agrees with the revision released
// to it; hauler #5 runs the same revision, but the replacement controller fitted to it came with the
// brake-release lockout off, so its proof does not hold for its settings.
const HAULER_SETTINGS = {
  format: "chainproof/controller-record@1",
  pack: { chemistry: "lead-acid", seriesCells: 24, capacityAh: 150, continuousC: 1, fuseA: 200 },
  controller: { description: "48 V series-wound drive controller, 300 A", ratedCurrentA: 300, minVoltageV: 36, maxVoltageV: 63 },
  settings: {
    lowVoltageCutbackV: 43,
    overVoltageCutoffV: 61,
    batteryCurrentPercent: 40,
    motorCurrentPercent: 100,
    throttle: { sensor: "hall", restV: 0.8, fullV: 4.2, releasedBelowV: 1.0, appliedFromV: 1.2, faultBelowV: 0.5, faultAboveV: 4.6 },
    brakeCutsDrive: true,
    lockouts: ["power-on", "enable-restore", "direction-engage", "brake-release"],
    precharge: { resistorOhm: 100, capacitanceUF: 2200, delayMs: 800 },
  },
};

const DEMO_RECORDS: { vehicle: string; hoursAgo: number; by: string; document: Record<string, unknown> }[] = [
  { vehicle: "Haybarn campus hauler #3", hoursAgo: 22, by: DEMO_USERS[2].email, document: HAULER_SETTINGS },
  { vehicle: "Haybarn campus hauler #5", hoursAgo: 22, by: DEMO_USERS[2].email, document: HAULER_SETTINGS },
  {
    vehicle: "Haybarn campus hauler #5",
    hoursAgo: 3,
    by: DEMO_USERS[2].email,
    document: {
      ...HAULER_SETTINGS,
      controller: { ...HAULER_SETTINGS.controller, description: "48 V series-wound drive controller, 300 A (replacement unit)" },
      settings: { ...HAULER_SETTINGS.settings, lockouts: ["power-on", "enable-restore", "direction-engage"] },
    },
  },
];

/**
 * Releases the demo revision to hauler #5 too and adds the demo controller records, when no vehicle of
 * the workspace has a record yet; returns whether it did.
 */
export async function seedDemoControllerRecords(db: Seeder, workspaceId: string): Promise<boolean> {
  const any = await db
    .select({ id: schema.controllerRecord.id })
    .from(schema.controllerRecord)
    .where(eq(schema.controllerRecord.workspaceId, workspaceId))
    .limit(1);
  if (any[0]) return false;
  const vehicles = await db
    .select({ id: schema.vehicle.id, name: schema.vehicle.name })
    .from(schema.vehicle)
    .where(eq(schema.vehicle.workspaceId, workspaceId));
  const people = await db
    .select({ id: schema.user.id, email: schema.user.email })
    .from(schema.member)
    .innerJoin(schema.user, eq(schema.member.userId, schema.user.id))
    .where(eq(schema.member.workspaceId, workspaceId));
  const hauler3 = vehicles.find((v) => v.name === "Haybarn campus hauler #3");
  const hauler5 = vehicles.find((v) => v.name === "Haybarn campus hauler #5");
  const engineer = people.find((p) => p.email === DEMO_USERS[1].email);
  if (!hauler3 || !hauler5 || !engineer) return false;
  const release = await db
    .select({ revisionId: schema.vehicleRelease.revisionId })
    .from(schema.vehicleRelease)
    .where(and(eq(schema.vehicleRelease.workspaceId, workspaceId), eq(schema.vehicleRelease.vehicleId, hauler3.id)))
    .limit(1);
  if (!release[0]) return false;
  const hour = 3600 * 1000;
  const now = Date.now();
  await db.insert(schema.vehicleRelease).values({
    id: crypto.randomUUID(),
    workspaceId,
    vehicleId: hauler5.id,
    revisionId: release[0].revisionId,
    releasedBy: engineer.id,
    at: new Date(now - 23 * hour),
    note: "Same loom as hauler #3.",
  });
  const version = new Map<string, number>();
  for (const r of DEMO_RECORDS) {
    const v = vehicles.find((x) => x.name === r.vehicle)!;
    const by = people.find((p) => p.email === r.by);
    if (!by) throw new Error(`${r.by} must be a member of the workspace`);
    const n = (version.get(v.id) ?? 0) + 1;
    version.set(v.id, n);
    await db.insert(schema.controllerRecord).values({
      id: crypto.randomUUID(),
      workspaceId,
      vehicleId: v.id,
      version: n,
      document: r.document,
      recordedBy: by.id,
      recordedAt: new Date(now - r.hoursAgo * hour),
    });
  }
  return true;
}

/** For an installation seeded before controller records existed: adds hauler #5, its release and the records. */
export async function seedControllerRecordsOnly(databaseUrl: string, log: (s: string) => void = console.log) {
  const pool = new pg.Pool({ connectionString: databaseUrl, max: 2 });
  const db = drizzle(pool, { schema });
  try {
    const ws = await db.select({ id: schema.workspace.id }).from(schema.workspace).where(eq(schema.workspace.slug, DEMO_WORKSPACE.slug));
    if (!ws[0]) return log(`no workspace "${DEMO_WORKSPACE.slug}"; nothing to do`);
    const workspaceId = ws[0].id;
    const done = await db.transaction(async (tx) => {
      const has5 = await tx
        .select({ id: schema.vehicle.id })
        .from(schema.vehicle)
        .where(and(eq(schema.vehicle.workspaceId, workspaceId), eq(schema.vehicle.name, "Haybarn campus hauler #5")));
      if (!has5[0])
        await tx
          .insert(schema.vehicle)
          .values({ id: crypto.randomUUID(), workspaceId, ...VEHICLES.find((v) => v.name === "Haybarn campus hauler #5")! });
      return seedDemoControllerRecords(tx, workspaceId);
    });
    log(done ? "added the demo controller records" : "the demo workspace already has controller records (or no release); nothing done");
  } finally {
    await pool.end();
  }
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const url = process.env.DATABASE_URL;
  if (!url) {
    console.error("DATABASE_URL is not set");
    process.exit(2);
  }
  if (process.argv.includes("--designs")) await seedDesignsOnly(url);
  else if (process.argv.includes("--release")) await seedReleaseOnly(url);
  else if (process.argv.includes("--controller-records")) await seedControllerRecordsOnly(url);
  else await seed(url);
}
