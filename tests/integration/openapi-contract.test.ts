import { Ajv2020 } from 'ajv/dist/2020.js';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hallClosetPassPlan } from '@/tests/fixtures/plans';
import { api, appDb, postJson, signIn } from './helpers';

// The served description is checked against the served routes: what it says is valid is accepted, and what it
// says is invalid is refused with a 400 naming the field.

type JsonSchema = {
  type?: string | string[];
  properties?: Record<string, JsonSchema>;
  required?: string[];
  additionalProperties?: boolean;
  maxLength?: number;
  minLength?: number;
  maximum?: number;
  minimum?: number;
  enum?: unknown[];
  $ref?: string;
};
type OpenApiDoc = { paths: Record<string, Record<string, any>>; components: { schemas: Record<string, JsonSchema> } };

const db = appDb();
let doc: OpenApiDoc;
let installer: string;
let ajv: Ajv2020;

beforeAll(async () => {
  const res = await api('/api/openapi.json');
  expect(res.status).toBe(200);
  expect(res.headers.get('content-type')).toMatch(/^application\/json/);
  doc = res.body;
  installer = await signIn('installer@nookpass.demo');
  // Formats are annotations here; the routes' own checks decide what a string must look like.
  ajv = new Ajv2020({ strict: false, allErrors: true, validateFormats: false });
  ajv.addSchema({ $id: 'https://nookpass.invalid/openapi.json', components: doc.components });
});
afterAll(async () => {
  await db.destroy();
});

function bodySchema(path: string, method: string): JsonSchema {
  const schema = doc.paths[path]?.[method]?.requestBody?.content?.['application/json']?.schema;
  expect(schema, `${method} ${path} describes a JSON body`).toBeDefined();
  return schema;
}

function validator(schema: JsonSchema) {
  const rooted = JSON.parse(JSON.stringify(schema).replaceAll('"#/components/', '"https://nookpass.invalid/openapi.json#/components/'));
  return ajv.compile(rooted);
}

type Violation = { field: string; why: string; body: Record<string, unknown> };

/** Bodies the description refuses, made from the description itself: one per broken constraint. */
function violations(schema: JsonSchema, valid: Record<string, unknown>): Violation[] {
  const out: Violation[] = [];
  for (const field of schema.required ?? []) {
    const body = { ...valid };
    delete body[field];
    out.push({ field, why: 'required field left out', body });
  }
  for (const [field, prop] of Object.entries(schema.properties ?? {})) {
    if (prop.type === 'string' && prop.maxLength !== undefined) out.push({ field, why: `over maxLength ${prop.maxLength}`, body: { ...valid, [field]: 'x'.repeat(prop.maxLength + 1) } });
    if (prop.type === 'string' && prop.minLength && prop.minLength > 1) out.push({ field, why: `under minLength ${prop.minLength}`, body: { ...valid, [field]: 'x'.repeat(prop.minLength - 1) } });
    if (prop.enum) out.push({ field, why: 'not one of the choices', body: { ...valid, [field]: 'not-a-choice' } });
    if (prop.type === 'integer' && prop.minimum !== undefined) out.push({ field, why: `under minimum ${prop.minimum}`, body: { ...valid, [field]: prop.minimum - 1 } });
    if (prop.type === 'integer') out.push({ field, why: 'not an integer', body: { ...valid, [field]: 1.5 } });
    if (prop.type === 'boolean') out.push({ field, why: 'not a boolean', body: { ...valid, [field]: 'yes' } });
  }
  if (schema.additionalProperties === false) out.push({ field: 'unknownField', why: 'a field the description does not list', body: { ...valid, unknownField: 1 } });
  return out;
}

async function expectContract(opts: { path: string; url: string; method: 'post' | 'patch'; valid: () => Record<string, unknown>; okStatus: number }) {
  const schema = bodySchema(opts.path, opts.method);
  const validate = validator(schema);
  const valid = opts.valid();
  expect(validate(valid), JSON.stringify(validate.errors)).toBe(true);
  const accepted = await api(opts.url, postJson(valid, { cookie: installer, method: opts.method.toUpperCase() }));
  expect(accepted.status, JSON.stringify(accepted.body)).toBe(opts.okStatus);

  const bad = violations(schema, opts.valid());
  expect(bad.length).toBeGreaterThan(0);
  for (const v of bad) {
    expect(validate(v.body), `${v.field}: ${v.why} is refused by the description`).toBe(false);
    const refused = await api(opts.url, postJson(v.body, { cookie: installer, method: opts.method.toUpperCase() }));
    expect(refused.status, `${opts.method} ${opts.url} ${v.field}: ${v.why}`).toBe(400);
    const named = (refused.body.errors as { path: string; message: string }[]).some((e) => e.path === v.field || e.path.startsWith(`${v.field}.`) || e.message.includes(v.field));
    expect(named, `${v.field} named in ${JSON.stringify(refused.body.errors)}`).toBe(true);
  }
}

const unique = () => Math.random().toString(36).slice(2, 10);

describe('the OpenAPI description matches what the routes accept', () => {
  it('POST /api/projects', async () => {
    await expectContract({
      path: '/api/projects',
      url: '/api/projects',
      method: 'post',
      okStatus: 201,
      valid: () => ({ name: `IT openapi ${unique()}`, siteAddress: '12 Contract Lane (demo)', jurisdiction: 'demo-county', permitNumber: 'P-1', notes: 'demo' }),
    });
  });

  it('PATCH /api/projects/{id}', async () => {
    const created = await api('/api/projects', postJson({ name: `IT openapi ${unique()}`, siteAddress: '14 Contract Lane (demo)', jurisdiction: 'demo-county' }, { cookie: installer }));
    expect(created.status).toBe(201);
    await expectContract({
      path: '/api/projects/{id}',
      url: `/api/projects/${created.body.id}`,
      method: 'patch',
      okStatus: 200,
      valid: () => ({ siteAddress: '16 Contract Lane (demo)', archived: false }),
    });
  });

  it('POST /api/projects/{id}/checks', async () => {
    const created = await api('/api/projects', postJson({ name: `IT openapi ${unique()}`, siteAddress: '18 Contract Lane (demo)', jurisdiction: 'demo-county' }, { cookie: installer }));
    const saved = await api(`/api/projects/${created.body.id}/plans`, postJson({ plan: hallClosetPassPlan }, { cookie: installer }));
    expect(saved.status).toBe(201);
    await expectContract({ path: '/api/projects/{id}/checks', url: `/api/projects/${created.body.id}/checks`, method: 'post', okStatus: 201, valid: () => ({ revision: 1 }) });
  });

  it('POST /api/appliances', async () => {
    await expectContract({
      path: '/api/appliances',
      url: '/api/appliances',
      method: 'post',
      okStatus: 201,
      valid: () => ({ kind: 'dryer', label: `IT demo dryer ${unique()}`, widthIn: 27, depthIn: 31, heightIn: 38.5 }),
    });
  });

  it('POST /api/webhooks', async () => {
    // The .test name never resolves (RFC 2606): nothing is ever delivered there.
    const url = `https://hooks-${unique()}.contract.example.test/in`;
    try {
      await expectContract({ path: '/api/webhooks', url: '/api/webhooks', method: 'post', okStatus: 201, valid: () => ({ url, events: ['report.sent'] }) });
    } finally {
      // The demo company's endpoint stops at once, so other tests' sends record nothing for it.
      await db.updateTable('webhook_endpoints').set({ is_active: false }).where('url', '=', url).execute();
    }
  });

  it('POST /api/evaluations: a demo plan is valid by the described plan schema and evaluated; a broken one is refused', async () => {
    await expectContract({ path: '/api/evaluations', url: '/api/evaluations', method: 'post', okStatus: 200, valid: () => ({ jurisdiction: 'demo-county', plan: hallClosetPassPlan }) });
    // Inside the plan: the described enum of a field is what the route takes.
    const validate = validator(bodySchema('/api/evaluations', 'post'));
    const badUnits = { jurisdiction: 'demo-county', plan: { ...hallClosetPassPlan, units: 'cubits' } };
    expect(validate(badUnits)).toBe(false);
    const refused = await api('/api/evaluations', postJson(badUnits, { cookie: installer }));
    expect(refused.status).toBe(400);
    expect(JSON.stringify(refused.body.errors)).toContain('units');
  });

  it('GET /api/projects: query parameters as described', async () => {
    const params = doc.paths['/api/projects'].get.parameters as { name: string; schema: JsonSchema }[];
    const page = params.find((p) => p.name === 'page')!.schema;
    const pageSize = params.find((p) => p.name === 'pageSize')!.schema;
    expect((await api(`/api/projects?page=${page.maximum}&pageSize=${pageSize.maximum}`, { cookie: installer })).status).toBe(200);
    for (const [query, field] of [[`page=${page.maximum! + 1}`, 'page'], [`pageSize=${pageSize.maximum! + 1}`, 'pageSize'], ['sort=colour', 'sort'], ['pageSize=0', 'pageSize']]) {
      const res = await api(`/api/projects?${query}`, { cookie: installer });
      expect(res.status, query).toBe(400);
      expect(res.body.errors.map((e: { path: string }) => e.path)).toContain(field);
    }
  });

  it('states the errors a route gives: 401 without a token, 403 for the wrong role, 404 for another company’s project', async () => {
    const projects = doc.paths['/api/projects'];
    expect(Object.keys(projects.post.responses)).toEqual(expect.arrayContaining(['401', '403']));
    expect((await api('/api/projects', postJson({}))).status).toBe(401);
    const inspector = await signIn('inspector@nookpass.demo');
    expect((await api('/api/projects', postJson({ name: 'x', siteAddress: 'xyz', jurisdiction: 'demo-county' }, { cookie: inspector }))).status).toBe(403);
    expect(Object.keys(doc.paths['/api/projects/{id}'].get.responses)).toContain('404');
    const other = await signIn('other-installer@nookpass.demo');
    const mine = await api('/api/projects', postJson({ name: `IT openapi ${unique()}`, siteAddress: '20 Contract Lane (demo)', jurisdiction: 'demo-county' }, { cookie: installer }));
    expect((await api(`/api/projects/${mine.body.id}`, { cookie: other })).status).toBe(404);
  });
});
