import { writeDemoScenario } from '@/db/demo-seed';
import type { DB } from '@/db/index';
import { hashAtCurrentCost, needsRehash, verifyPassword } from '@/lib/platform/auth/password';

/** Seeds the invented demo scenario (local use and tests). Idempotent: a second run changes no rows. */
export function seedDemo(db: DB): Promise<void> {
  return writeDemoScenario(db, { hashAtCurrentCost, needsRehash, verifyPassword });
}
