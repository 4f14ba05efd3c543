import { z } from 'zod';
import { json, route } from '@/lib/platform/http';
import { planInputSchema } from '@/lib/domain/plan';

// Public and static: integrators build against it before they have an account.
const schema = z.toJSONSchema(planInputSchema, { io: 'input', unrepresentable: 'any' });

export const GET = route(async () => json(schema, { headers: { 'cache-control': 'public, max-age=300' } }));
