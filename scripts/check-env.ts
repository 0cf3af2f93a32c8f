// Preflight for the start and test commands: a missing or bad variable ends here, named.
import { parseEnv } from "@/lib/env";

try {
  parseEnv(process.env);
} catch (e) {
  console.error(e instanceof Error ? e.message : e);
  process.exit(1);
}
