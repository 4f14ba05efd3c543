import { json } from '@/lib/platform/http';
import { buildOpenApiDocument } from '@/lib/platform/openapi/document';

let document: ReturnType<typeof buildOpenApiDocument> | null = null;

// Public, like the plan's JSON Schema: it says what the API takes, nothing about anyone's data.
export function GET() {
  document ??= buildOpenApiDocument();
  return json(document, { headers: { 'cache-control': 'public, max-age=300' } });
}
