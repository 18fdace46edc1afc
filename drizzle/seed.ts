// Demo data of our own invented scenario: Larkspur Light Vehicles, a small maker of electric utility
// vehicles, with four people (one per role) and three vehicles. Runs only on an empty database.
import { sql } from "drizzle-orm";
import { drizzle } from "drizzle-orm/node-postgres";
import pg from "pg";
import { hashPassword } from "better-auth/crypto";
import * as schema from "../app/db/schema.server";

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
        await tx.insert(schema.account).values({ id: crypto.randomUUID(), accountId: userId, providerId: "credential", userId, password: hash });
        await tx.insert(schema.member).values({ id: crypto.randomUUID(), workspaceId, userId, role: u.role });
      }
      for (const v of VEHICLES) await tx.insert(schema.vehicle).values({ id: crypto.randomUUID(), workspaceId, ...v });
    });
    log(`seeded the demo workspace "${DEMO_WORKSPACE.name}"`);
    return true;
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
  await seed(url);
}
