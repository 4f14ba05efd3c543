import { z } from 'zod';
import { createDocument, type ZodOpenApiOperationObject, type ZodOpenApiPathsObject, type ZodOpenApiResponsesObject } from 'zod-openapi';
import { apiRoutes, type Method, type OperationEntry } from '@/lib/platform/openapi/routes';

const fieldErrors = z
  .object({
    error: z.string(),
    errors: z.array(z.object({ path: z.string().describe('Dotted path of the field, or (body) / (request).'), message: z.string() })),
  })
  .meta({ id: 'FieldErrors', description: 'Every field that was refused, by its dotted path.' });

const plainError = z.object({ error: z.string() }).meta({ id: 'Error' });

const retryAfter = z.string().meta({ description: 'Seconds to wait before trying again (RFC 9110 §10.2.3).' });

/** `app/api/projects/[id]/plans/route.ts` key → `/api/projects/{id}/plans`. */
export function apiPathOf(file: string): string {
  const segments = file.replace(/\/?route\.ts$/, '').split('/').filter(Boolean);
  return '/api/' + segments.map((s) => s.replace(/^\[(?:\.\.\.)?(.+)\]$/, '{$1}')).join('/');
}

function pathParams(path: string): string[] {
  return [...path.matchAll(/\{([^}]+)\}/g)].map((m) => m[1]);
}

function errorResponses(entry: OperationEntry, hasPathParams: boolean): ZodOpenApiResponsesObject {
  const out: ZodOpenApiResponsesObject = {};
  const jsonError = (description: string, schema: z.ZodType = plainError) => ({ description, content: { 'application/json': { schema } } });
  if (entry.body || entry.query) out['400'] = jsonError('The request was refused; each refused field is named.', fieldErrors);
  if (entry.access !== 'public') out['401'] = jsonError('No session and no valid API token.');
  if (entry.access === 'browser') out['403'] = jsonError('Needs a signed-in browser; API tokens are refused.');
  else if (Array.isArray(entry.access)) out['403'] = jsonError(`Only for: ${entry.access.join(', ')}.`);
  if (hasPathParams || entry.notFound) out['404'] = jsonError(entry.notFound ?? 'Not found, or it belongs to another company.');
  if (entry.conflict) out['409'] = jsonError(entry.conflict, fieldErrors.partial({ errors: true }).extend({ needsConfirmation: z.boolean().optional() }));
  if (entry.body) out['413'] = jsonError('The body is over its limit (JSON 512 KiB).');
  if (entry.rateLimited) out['429'] = { ...jsonError(`Too many requests: ${entry.rateLimited}`), headers: z.object({ 'Retry-After': retryAfter }) };
  return out;
}

function operation(path: string, method: Method, entry: OperationEntry, tag: string): ZodOpenApiOperationObject {
  const params = pathParams(path);
  const op: ZodOpenApiOperationObject = {
    operationId: `${method}${path.replace(/[^a-zA-Z0-9]+(.)?/g, (_m, c: string | undefined) => (c ? c.toUpperCase() : ''))}`,
    summary: entry.summary,
    tags: [tag],
    security: entry.access === 'public' ? [] : entry.access === 'browser' ? [{ sessionCookie: [] }] : [{ bearerToken: [] }, { sessionCookie: [] }],
    responses: {},
  };
  if (Array.isArray(entry.access)) op.description = `Roles: ${entry.access.join(', ')}.`;
  if (params.length > 0 || entry.query) {
    op.requestParams = {};
    if (params.length > 0) op.requestParams.path = z.object(Object.fromEntries(params.map((p) => [p, z.string()])));
    if (entry.query) op.requestParams.query = entry.query;
  }
  if (entry.body) {
    op.requestBody =
      'json' in entry.body
        ? { required: true, content: { 'application/json': { schema: entry.body.json } } }
        : { required: true, description: entry.body.description, content: { [entry.body.raw]: { schema: z.string().meta({ format: 'binary' }) } } };
  }
  const contentType = entry.ok.contentType ?? 'application/json';
  const okContent =
    entry.ok.status === 204 || entry.ok.status === 202 && !entry.ok.schema
      ? undefined
      : { [contentType]: contentType === 'application/json' ? (entry.ok.schema ? { schema: entry.ok.schema } : {}) : { schema: z.string().meta({ format: contentType === 'text/csv' ? undefined : 'binary' }) } };
  op.responses = {
    [String(entry.ok.status)]: { description: entry.ok.description, ...(okContent ? { content: okContent } : {}) },
    ...errorResponses(entry, params.length > 0),
  };
  return op;
}

/** The OpenAPI 3.1 description of every documented route, generated from the routes' zod schemas. */
export function buildOpenApiDocument(serverUrl?: string) {
  const paths: ZodOpenApiPathsObject = {};
  for (const [file, entry] of Object.entries(apiRoutes)) {
    if ('undocumented' in entry) continue;
    const path = apiPathOf(file);
    const tag = path.split('/')[2].replace(/\..*$/, '');
    paths[path] = Object.fromEntries(
      (Object.entries(entry) as [Method, OperationEntry][]).map(([method, op]) => [method, operation(path, method, op, tag)]),
    );
  }
  return createDocument(
    {
      openapi: '3.1.0',
      info: {
        title: 'NookPass API',
        version: '1',
        description:
          'Plan, check and document laundry-closet installations against the locally adopted codes. Findings defer to the ' +
          'locally adopted code, the AHJ and licensed trades. Authenticate with an API token from the Account page: ' +
          '`Authorization: Bearer <token>`.',
      },
      ...(serverUrl ? { servers: [{ url: serverUrl }] } : {}),
      paths,
      components: {
        securitySchemes: {
          bearerToken: { type: 'http', scheme: 'bearer', description: 'An API token created on the Account page.' },
          sessionCookie: { type: 'apiKey', in: 'cookie', name: 'next-auth.session-token', description: 'A signed-in browser session.' },
        },
      },
    },
    { allowEmptySchema: { custom: true } },
  );
}
