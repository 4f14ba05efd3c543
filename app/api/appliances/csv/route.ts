import { getDb } from '@/db';
import { requireUser } from '@/lib/platform/auth/session';
import { json, readTextUpTo, route } from '@/lib/platform/http';
import { exportAppliancesCsv, importAppliancesCsv } from '@/lib/services/appliances';

/** A library file of a few thousand models is well under this (common practice, no published source). */
const CSV_LIMIT_BYTES = 1024 * 1024;

export const GET = route(async (request) => {
  const user = await requireUser(request, ['installer']);
  return new Response(await exportAppliancesCsv(getDb(), user), {
    headers: {
      'content-type': 'text/csv; charset=utf-8; header=present',
      'content-disposition': 'attachment; filename="appliance-library.csv"',
      'cache-control': 'no-store',
    },
  });
});

/** The body is the CSV file itself (content-type text/csv). */
export const POST = route(async (request) => {
  const user = await requireUser(request, ['installer']);
  const text = await readTextUpTo(request, CSV_LIMIT_BYTES, 'The CSV file is larger than 1 MiB.');
  return json(await importAppliancesCsv(getDb(), user, text), 201);
});
