import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { Validator } from '@seriousme/openapi-schema-validator';
import { describe, expect, it } from 'vitest';
import { apiPathOf, buildOpenApiDocument } from '@/lib/platform/openapi/document';
import { apiRoutes } from '@/lib/platform/openapi/routes';

const API_DIR = join(process.cwd(), 'app', 'api');

function routeFiles(dir: string): string[] {
  return readdirSync(dir).flatMap((name) => {
    const full = join(dir, name);
    if (statSync(full).isDirectory()) return routeFiles(full);
    return name === 'route.ts' ? [relative(API_DIR, full).split('\\').join('/')] : [];
  });
}

/** The HTTP methods a route file exports, read from its text (importing it would need the database). */
function exportedMethods(file: string): string[] {
  const text = readFileSync(join(API_DIR, file), 'utf8');
  const found = new Set<string>();
  for (const m of text.matchAll(/export\s+(?:const|async\s+function|function)\s+(GET|POST|PUT|PATCH|DELETE)\b/g)) found.add(m[1]);
  for (const m of text.matchAll(/export\s*\{([^}]*)\}/g)) for (const name of m[1].split(',').map((s) => s.trim().split(/\s+as\s+/).pop()!)) if (/^(GET|POST|PUT|PATCH|DELETE)$/.test(name)) found.add(name);
  return [...found].map((m) => m.toLowerCase()).sort();
}

describe('OpenAPI description', () => {
  const document = buildOpenApiDocument();

  it('validates as OpenAPI 3.1', async () => {
    const validator = new Validator();
    const result = await validator.validate(JSON.parse(JSON.stringify(document)));
    expect(result.errors ?? []).toEqual([]);
    expect(result.valid).toBe(true);
    expect(validator.version).toBe('3.1');
  });

  it('the validator refuses a broken document (the check above can fail)', async () => {
    const broken = JSON.parse(JSON.stringify(document));
    broken.paths['/api/projects'].get.responses = { '200': { content: {} } }; // a response without its required description
    const result = await new Validator().validate(broken);
    expect(result.valid).toBe(false);
  });

  it('has an entry for every route file under app/api, with the methods the file exports', () => {
    const files = routeFiles(API_DIR).sort();
    expect(files.length).toBeGreaterThan(50);
    const missing = files.filter((f) => !(f in apiRoutes));
    expect(missing, 'add these route files to apiRoutes in lib/platform/openapi/routes.ts').toEqual([]);
    const stale = Object.keys(apiRoutes).filter((f) => !files.includes(f));
    expect(stale, 'entries for route files that no longer exist').toEqual([]);
    for (const file of files) {
      const entry = apiRoutes[file];
      if ('undocumented' in entry) continue;
      expect(Object.keys(entry).sort(), file).toEqual(exportedMethods(file));
      const path = apiPathOf(file);
      expect(Object.keys(document.paths?.[path] ?? {}).sort(), path).toEqual(exportedMethods(file));
    }
  });

  it('names the Bearer scheme and the error answers', () => {
    expect(document.components?.securitySchemes?.bearerToken).toMatchObject({ type: 'http', scheme: 'bearer' });
    const post = document.paths?.['/api/projects']?.post;
    expect(Object.keys(post?.responses ?? {}).sort()).toEqual(['201', '400', '401', '403', '413']);
    expect(post?.security).toEqual([{ bearerToken: [] }, { sessionCookie: [] }]);
    // RFC 6585 §4: a 429 says how long to wait.
    expect(document.paths?.['/api/checks/{id}/send']?.post?.responses?.['429']).toMatchObject({ headers: { 'Retry-After': { required: true } } });
    expect(document.paths?.['/api/projects/{id}']?.get?.responses?.['404']).toBeDefined();
    expect(document.paths?.['/api/health']?.get?.security).toEqual([]);
  });

  it('describes request bodies and queries from the routes’ schemas', () => {
    const body = document.paths?.['/api/projects']?.post?.requestBody as { content: Record<string, { schema: { required?: string[]; properties?: Record<string, unknown> } }> };
    expect(body.content['application/json'].schema.required).toEqual(expect.arrayContaining(['name', 'jurisdiction']));
    const query = (document.paths?.['/api/projects.csv']?.get?.parameters ?? []) as { name: string }[];
    expect(query.map((p) => p.name).sort()).toEqual(['archived', 'dir', 'q', 'sort']);
  });

  it('describes the jurisdictions list with each one’s time zone', () => {
    const ok = document.paths?.['/api/jurisdictions']?.get?.responses?.['200'] as { content: Record<string, { schema: { type?: string; items?: { $ref?: string } } }> };
    expect(ok.content['application/json'].schema).toMatchObject({ type: 'array', items: { $ref: '#/components/schemas/JurisdictionListItem' } });
    const item = document.components?.schemas?.JurisdictionListItem as { required?: string[]; properties?: Record<string, { type?: string }> };
    expect(item.required).toEqual(expect.arrayContaining(['slug', 'timeZone', 'publishedVersion']));
    expect(item.properties?.timeZone).toMatchObject({ type: 'string' });
  });

  it('maps route files to URL paths', () => {
    expect(apiPathOf('projects/[id]/plans/[number]/route.ts')).toBe('/api/projects/{id}/plans/{number}');
    expect(apiPathOf('auth/[...nextauth]/route.ts')).toBe('/api/auth/{nextauth}');
    expect(apiPathOf('projects.csv/route.ts')).toBe('/api/projects.csv');
  });
});
