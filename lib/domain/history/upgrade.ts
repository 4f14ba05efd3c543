import { DomainError } from '@/lib/domain/errors';

/**
 * Stored history (plan revisions, checks, published rule sets, reports) is never rewritten when a
 * shape changes. Each row records the schema version it was written with, and on read a chain of
 * steps brings it to the shape this build knows, one version at a time.
 */

/** Brings a stored value from version n to n + 1. */
export type UpgradeStep = (stored: unknown) => unknown;

/** What a build knows of one stored shape: its current version and a step from every older version. */
export type UpgradeChain = {
  /** Names the shape in error messages ("Plan", "Rule set parameters"). */
  readonly what: string;
  readonly current: number;
  /** steps[n] upgrades version n to n + 1. */
  readonly steps: Readonly<Record<number, UpgradeStep>>;
};

/** A stored version this build cannot read: written by a newer build, or not a version at all. */
export class StoredVersionError extends DomainError {}

/** The step for a version whose shape the next one kept as it was. */
export const unchanged: UpgradeStep = (stored) => stored;

/** Versions below the current one that have no step (a complete chain has none). */
export function missingSteps(chain: UpgradeChain): number[] {
  const missing: number[] = [];
  for (let v = 0; v < chain.current; v++) if (typeof chain.steps[v] !== 'function') missing.push(v);
  return missing;
}

export function upgradeStored(stored: unknown, fromVersion: number, chain: UpgradeChain): unknown {
  if (!Number.isInteger(fromVersion) || fromVersion < 0) {
    throw new StoredVersionError(`${chain.what} records schema version ${String(fromVersion)}, which is not a version number.`);
  }
  if (fromVersion > chain.current) {
    throw new StoredVersionError(
      `${chain.what} was written with schema version ${fromVersion}, but this build reads versions up to ${chain.current}: ` +
        'a newer build saved it. Run that build or a later one; stored history is never rewritten to fit an older one.',
    );
  }
  if (fromVersion === chain.current) return stored;
  // A copy, so a step that edits its argument cannot reach the caller's value (a cached row, say).
  let value = structuredClone(stored);
  for (let v = fromVersion; v < chain.current; v++) {
    const step = chain.steps[v];
    if (typeof step !== 'function') throw new StoredVersionError(`${chain.what}: no upgrade step from schema version ${v} to ${v + 1}.`);
    value = step(value);
  }
  return value;
}
