// Runs once when a Next server starts: every app server also works the job queue (e-mail delivery and the
// periodic passes). Only in the Node.js runtime; NOOKPASS_WORKERS=0 turns the workers off for a server.
export async function register() {
  if (process.env.NEXT_RUNTIME !== 'nodejs' || process.env.NOOKPASS_WORKERS === '0') return;
  const { startWorkersInBackground } = await import('@/lib/services/jobs/workers');
  startWorkersInBackground();
}
