// Demo data for the invented City of Larkspur Falls. Idempotent: re-running updates the same
// rows by their natural keys (firm name, user e-mail) and adds nothing twice.
import { eq } from "drizzle-orm";
import { closeDb, db } from "./client";
import { firms, users } from "./schema";
import { hashPassword } from "@/lib/auth/password";
import { DEMO_FIRMS, DEMO_PASSWORD, DEMO_USERS } from "./demo-accounts";
import { seedApplications } from "./seed-applications";
import { seedHistory } from "./seed-history";
import { seedChecks } from "@/lib/checks/seed";

export async function seedBase(): Promise<void> {
  const database = db();
  const firmIds = new Map<string, number>();
  for (const f of DEMO_FIRMS) {
    const [existing] = await database.select({ id: firms.id }).from(firms).where(eq(firms.name, f.name)).limit(1);
    if (existing) firmIds.set(f.name, existing.id);
    else {
      const [row] = await database.insert(firms).values(f).$returningId();
      if (row) firmIds.set(f.name, row.id);
    }
  }
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  for (const u of DEMO_USERS) {
    const values = {
      email: u.email,
      name: u.name,
      role: u.role,
      title: u.title,
      status: "active" as const,
      passwordHash,
      firmId: u.firm ? (firmIds.get(u.firm) ?? null) : null,
    };
    await database
      .insert(users)
      .values(values)
      .onDuplicateKeyUpdate({ set: { name: values.name, role: values.role, title: values.title, status: "active", passwordHash, firmId: values.firmId } });
  }
}

const isMain = process.argv[1]?.endsWith("seed.ts");
if (isMain) {
  try {
    await seedBase();
    const added = await seedApplications(db());
    console.log(`[seed] demo department ready: ${DEMO_USERS.length} accounts, password "${DEMO_PASSWORD}"; ${added ? `${added} demo applications added` : "demo applications already present"}`);
    const checks = await seedChecks(db());
    if (checks) console.log(`[seed] ${checks} demo deflection checks added`);
    const history = await seedHistory(db());
    console.log(`[seed] ${history ? `a year of review history added: ${history} applications` : "review history already present"}`);
  } catch (e) {
    console.error("[seed] failed:", e instanceof Error ? e.message : e);
    process.exitCode = 1;
  } finally {
    await closeDb();
  }
}
