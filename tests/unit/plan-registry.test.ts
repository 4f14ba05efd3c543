import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { planInputSchema } from '@/lib/domain/plan';

// The public JSON Schema (GET /api/schema/plan) as the plan schema produced it before the field registry;
// integrators build against it, so deriving the schema from the registry must not change it.
const published = JSON.parse(readFileSync('tests/fixtures/schema/plan-input.schema.json', 'utf8'));

describe('plan JSON Schema', () => {
  it('is the published one', () => {
    expect(z.toJSONSchema(planInputSchema, { io: 'input', unrepresentable: 'any' })).toEqual(published);
  });
});
