// The live check's own module, bundled for the browser by tests/e2e/live-check-parity.spec.ts.
import { runLive } from '@/components/live-check/live-engine';
import { parsePlan } from '@/lib/domain/plan';

(globalThis as unknown as Record<string, unknown>).nookpassLive = { runLive, parsePlan };
