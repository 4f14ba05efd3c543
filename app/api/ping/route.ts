// A bare handler with a fixed answer and no database: the baseline the benchmark compares the API against.
export function GET() {
  return Response.json({ ok: true, service: 'nookpass' });
}
