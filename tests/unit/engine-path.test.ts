import { JSONPath } from 'jsonpath-plus';
import { describe, expect, it } from 'vitest';
import { resolveSimplePath } from '@/lib/domain/engine';
import { defaultParameters, readParam } from '@/lib/domain/params';

const params = defaultParameters({ building: 'IRC 2021', electrical: 'NEC 2023', plumbing: 'UPC 2021', plumbingFamily: 'UPC', mechanical: 'IMC 2021', fuelGas: 'IFGC 2021' });

// Reference: json-rules-engine's default path resolver, JSONPath from the jsonpath-plus package (wrap: false).
const reference = (value: unknown, path: string) => JSONPath({ path, json: value as object, wrap: false });

function paths(obj: unknown, prefix = '$'): string[] {
  if (obj === null || typeof obj !== 'object' || Array.isArray(obj)) return [prefix];
  return Object.entries(obj).flatMap(([k, v]) => [prefix + '.' + k, ...paths(v, `${prefix}.${k}`)]).filter((p, i, a) => a.indexOf(p) === i);
}

describe('engine path resolver', () => {
  it('reads every parameter path exactly as the default JSONPath resolver does', () => {
    const all = paths(params).filter((p) => p !== '$');
    expect(all.length).toBeGreaterThan(30);
    for (const p of all) {
      expect(resolveSimplePath(params, p), p).toEqual(reference(params, p));
      expect(readParam(params, p), p).toEqual(reference(params, p));
    }
  });

  it('returns undefined for a path that is not there, like the reference', () => {
    expect(resolveSimplePath(params, '$.exhaust.nothing')).toBeUndefined();
    expect(reference(params, '$.exhaust.nothing')).toBeUndefined();
    expect(resolveSimplePath(params, '$.exhaust.maxDevelopedLengthIn.deeper')).toBeUndefined();
  });

  it('reads the 35 ft code maximum at its path', () => {
    // IRC 2021 M1502.4.6.1: 35 ft = 420 in.
    expect(resolveSimplePath(params, '$.exhaust.maxDevelopedLengthIn')).toBe(420);
  });
});
