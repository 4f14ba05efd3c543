import { randomBytes } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { APPLIANCE_CSV_HEADER } from '@/lib/domain/appliances/model';
import { api, appDb, newInstallerCompany, postJson, signIn } from './helpers';

const db = appDb();
let own: { cookie: string; organizationId: string }; // a company of its own, so counts are this file's
let colleague: string;
let other: string;
let inspector: string;
let admin: string;

const tag = () => randomBytes(3).toString('hex');
const washer = (label: string) => ({ kind: 'washer', label, widthIn: 27, depthIn: '813 mm', heightIn: 39, clearanceRearIn: 4 });

beforeAll(async () => {
  own = await newInstallerCompany(db, 'appliances');
  [colleague, other, inspector, admin] = await Promise.all([
    signIn('installer@nookpass.demo'),
    signIn('other-installer@nookpass.demo'),
    signIn('inspector@nookpass.demo'),
    signIn('admin@nookpass.demo'),
  ]);
});
afterAll(async () => {
  await db.destroy();
});

async function csvImport(cookie: string, text: string) {
  return api('/api/appliances/csv', { method: 'POST', cookie, headers: { 'content-type': 'text/csv' }, body: text });
}

describe('appliance library API', () => {
  it('creates, reads, changes and deletes a model of the caller’s company', async () => {
    const created = await api('/api/appliances', postJson(washer(`IT washer ${tag()}`), { cookie: own.cookie }));
    expect(created.status).toBe(201);
    // 813 mm / 25.4 mm per inch (NIST SP 811: 1 in = 25.4 mm exactly) = 32.0079 in
    expect(created.body.depthIn).toBeCloseTo(813 / 25.4, 9);
    expect(created.body).toMatchObject({ kind: 'washer', widthIn: 27, fuel: null, isDemo: false });

    const list = await api('/api/appliances', { cookie: own.cookie });
    expect(list.body.items.map((m: { id: string }) => m.id)).toEqual([created.body.id]);

    const changed = await api(`/api/appliances/${created.body.id}`, postJson({ clearanceRearIn: '6 in', frontProjectionIn: 2 }, { cookie: own.cookie, method: 'PATCH' }));
    expect(changed.status).toBe(200);
    expect(changed.body).toMatchObject({ clearanceRearIn: 6, frontProjectionIn: 2, widthIn: 27 });

    const cleared = await api(`/api/appliances/${created.body.id}`, postJson({ frontProjectionIn: null }, { cookie: own.cookie, method: 'PATCH' }));
    expect(cleared.body.frontProjectionIn).toBeNull();

    expect((await api(`/api/appliances/${created.body.id}`, { cookie: own.cookie, method: 'DELETE' })).status).toBe(204);
    expect((await api(`/api/appliances/${created.body.id}`, { cookie: own.cookie })).status).toBe(404);
    const audit = await db.selectFrom('audit_log').select('action').where('entity_id', '=', created.body.id).orderBy('id').execute();
    expect(audit.map((a) => a.action)).toEqual(['appliance.create', 'appliance.update', 'appliance.update', 'appliance.delete']);
  });

  it('answers each role: installers only, and another company’s model is 404', async () => {
    const mine = (await api('/api/appliances', postJson(washer(`IT scoped ${tag()}`), { cookie: own.cookie }))).body;
    expect((await api('/api/appliances')).status).toBe(401);
    for (const cookie of [inspector, admin]) {
      expect((await api('/api/appliances', { cookie })).status).toBe(403);
      expect((await api('/api/appliances', postJson(washer('x'), { cookie }))).status).toBe(403);
      expect((await api(`/api/appliances/${mine.id}`, { cookie })).status).toBe(403);
      expect((await api('/api/appliances/csv', { cookie })).status).toBe(403);
    }
    for (const cookie of [colleague, other]) {
      expect((await api(`/api/appliances/${mine.id}`, { cookie })).status).toBe(404);
      expect((await api(`/api/appliances/${mine.id}`, postJson({ label: 'taken over' }, { cookie, method: 'PATCH' }))).status).toBe(404);
      expect((await api(`/api/appliances/${mine.id}`, { cookie, method: 'DELETE' })).status).toBe(404);
      const theirs = await api('/api/appliances', { cookie });
      expect(theirs.body.items.map((m: { id: string }) => m.id)).not.toContain(mine.id);
    }
    expect((await api(`/api/appliances/${mine.id}`, { cookie: own.cookie })).body.label).toBe(mine.label);
    expect((await api('/api/appliances/not-a-uuid', { cookie: own.cookie })).status).toBe(404);
  });

  it('seeds the demo company with invented models marked demo, for washer and dryer slots', async () => {
    const washers = await api('/api/appliances?slot=washer', { cookie: colleague });
    const dryers = await api('/api/appliances?slot=dryer', { cookie: colleague });
    const demo = (items: Array<{ isDemo: boolean; kind: string; label: string }>) => items.filter((m) => m.isDemo);
    expect(demo(washers.body.items).map((m) => m.kind).sort()).toEqual(['washer', 'washer', 'washer', 'washer-dryer']);
    expect(demo(dryers.body.items).map((m) => m.kind).sort()).toEqual(['dryer', 'dryer', 'dryer', 'dryer', 'dryer', 'washer-dryer']);
    for (const m of demo([...washers.body.items, ...dryers.body.items])) expect(m.label).toMatch(/\(demo\)$/);
    const second = await api('/api/appliances', { cookie: other });
    expect(demo(second.body.items)).toEqual([]);
  });

  it('refuses bad input with a 400 naming each field', async () => {
    const res = await api('/api/appliances', postJson({ kind: 'fridge', label: '', widthIn: -2, depthIn: 'deep', amps: 1.5, colour: 'white' }, { cookie: own.cookie }));
    expect(res.status).toBe(400);
    const paths = res.body.errors.map((e: { path: string }) => e.path);
    expect(paths).toEqual(expect.arrayContaining(['kind', 'label', 'widthIn', 'depthIn', 'heightIn', 'amps']));
    expect(res.body.errors.some((e: { message: string }) => /colour/.test(e.message))).toBe(true);

    const washerWithVent = await api('/api/appliances', postJson({ ...washer(`IT vent ${tag()}`), exhaustCfm: 180, dryerType: 'vented' }, { cookie: own.cookie }));
    expect(washerWithVent.status).toBe(400);
    expect(washerWithVent.body.errors.map((e: { path: string }) => e.path).sort()).toEqual(['dryerType', 'exhaustCfm']);

    const label = `IT twice ${tag()}`;
    expect((await api('/api/appliances', postJson(washer(label), { cookie: own.cookie }))).status).toBe(201);
    const twice = await api('/api/appliances', postJson(washer(label.toUpperCase()), { cookie: own.cookie }));
    expect(twice.status).toBe(400);
    expect(twice.body.errors[0].path).toBe('label');
  });

  it('exports CSV with the documented header and imports it back', async () => {
    const company = await newInstallerCompany(db, 'appliances csv');
    const file = [
      APPLIANCE_CSV_HEADER.join(','),
      'dryer,"IT dryer, ""quoted""",27,31,39,2.5,1,1,5.5,1,48,24,420,electric,vented,180,240,30',
      'washer,IT washer,27,813 mm,39,,,,,,,,,,,,120,15',
    ].join('\r\n');
    const imported = await csvImport(company.cookie, file);
    expect(imported.status).toBe(201);
    expect(imported.body).toEqual({ created: 2, updated: 0 });

    const exported = await api('/api/appliances/csv', { cookie: company.cookie });
    expect(exported.status).toBe(200);
    expect(exported.headers.get('content-type')).toMatch(/^text\/csv/);
    const lines = String(exported.body).split('\r\n');
    expect(lines[0]).toBe(APPLIANCE_CSV_HEADER.join(','));
    expect(lines).toContain('dryer,"IT dryer, ""quoted""",27,31,39,2.5,1,1,5.5,1,48,24,420,electric,vented,180,240,30');

    // The same file again replaces the two models instead of adding copies.
    const again = await csvImport(company.cookie, String(exported.body));
    expect(again.body).toEqual({ created: 0, updated: 2 });
  });

  it('reports a bad row by line and column and saves nothing of the file', async () => {
    const company = await newInstallerCompany(db, 'appliances bad csv');
    const before = await db.selectFrom('appliance_models').select('id').where('organization_id', '=', company.organizationId).execute();
    const file = [
      'kind,label,width_in,depth_in,height_in,fuel',
      'washer,IT good washer,27,32,39,',
      'dryer,IT bad dryer,27,31,tall,gas',
      'washer,IT washer with gas,27,32,39,gas',
    ].join('\n');
    const res = await csvImport(company.cookie, file);
    expect(res.status).toBe(400);
    expect(res.body.errors).toEqual([
      expect.objectContaining({ line: 3, column: 5, columnName: 'height_in', path: 'csv.line.3.height_in' }),
      expect.objectContaining({ line: 4, column: 6, columnName: 'fuel', path: 'csv.line.4.fuel' }),
    ]);
    expect(res.body.errors[0].message).toMatch(/^Line 3, column 5 \(height_in\): /);
    const after = await db.selectFrom('appliance_models').select('id').where('organization_id', '=', company.organizationId).execute();
    expect(after).toEqual(before);

    const unknownColumn = await csvImport(company.cookie, 'kind,label,width_in,depth_in,height_in,colour\nwasher,A,27,32,39,white\n');
    expect(unknownColumn.status).toBe(400);
    expect(unknownColumn.body.errors[0]).toMatchObject({ line: 1, column: 6, columnName: 'colour' });
  });

  it('deleting a model keeps the copy a plan took from it', async () => {
    const model = (await api('/api/appliances', postJson(washer(`IT picked ${tag()}`), { cookie: own.cookie }))).body;
    const project = (await api('/api/projects', postJson({ name: `IT library plan ${tag()}`, siteAddress: '7 Library Lane', jurisdiction: 'demo-county' }, { cookie: own.cookie }))).body;
    const plan = { units: 'imperial', washer: { model: { id: model.id, label: model.label }, width: 27, depth: model.depthIn, height: 39, clearances: { rear: 4 } } };
    const saved = await api(`/api/projects/${project.id}/plans`, postJson({ plan }, { cookie: own.cookie }));
    expect(saved.status).toBe(201);

    expect((await api(`/api/appliances/${model.id}`, { cookie: own.cookie, method: 'DELETE' })).status).toBe(204);
    const revision = await api(`/api/projects/${project.id}/plans/1`, { cookie: own.cookie });
    expect(revision.status).toBe(200);
    expect(revision.body.plan.washer).toEqual(plan.washer);

    // A plan naming a model that is gone still saves: the plan's copy is what counts.
    const resaved = await api(`/api/projects/${project.id}/plans`, postJson({ plan }, { cookie: own.cookie }));
    expect(resaved.status).toBe(201);
    const bad = await api(`/api/projects/${project.id}/plans`, postJson({ plan: { ...plan, washer: { ...plan.washer, model: { id: 'nope', label: 'x' } } } }, { cookie: own.cookie }));
    expect(bad.status).toBe(400);
    expect(bad.body.errors.map((e: { path: string }) => e.path)).toContain('plan.washer.model.id');
  });
});
