import { afterEach, describe, expect, it, vi } from 'vitest';

// The figures themselves are a judgement (common practice, no published source); these check how a deployment sets them.
async function load() {
  vi.resetModules();
  return import('@/lib/services/usage-limits');
}

afterEach(() => {
  vi.unstubAllEnvs();
});

describe('evaluation limits', () => {
  it('are 1,200 a minute per token and 2,400 per person unless the deployment says otherwise', async () => {
    vi.stubEnv('NOOKPASS_EVALUATIONS_PER_TOKEN_PER_MINUTE', '');
    vi.stubEnv('NOOKPASS_EVALUATIONS_PER_USER_PER_MINUTE', '');
    const { EVALUATIONS_PER_TOKEN, EVALUATIONS_PER_USER } = await load();
    expect(EVALUATIONS_PER_TOKEN).toMatchObject({ points: 1200, durationSeconds: 60 });
    expect(EVALUATIONS_PER_USER).toMatchObject({ points: 2400, durationSeconds: 60 });
    expect(EVALUATIONS_PER_TOKEN.message).toContain('1,200 evaluations');
    // Counted ahead in blocks of 1 % of the limit.
    expect(EVALUATIONS_PER_TOKEN.countAhead).toBe(12);
    expect(EVALUATIONS_PER_USER.countAhead).toBe(24);
  });

  it('take a raised figure from the environment and say it in the refusal', async () => {
    vi.stubEnv('NOOKPASS_EVALUATIONS_PER_TOKEN_PER_MINUTE', '5000');
    vi.stubEnv('NOOKPASS_EVALUATIONS_PER_USER_PER_MINUTE', '9000');
    const { EVALUATIONS_PER_TOKEN, EVALUATIONS_PER_USER } = await load();
    expect(EVALUATIONS_PER_TOKEN.points).toBe(5000);
    expect(EVALUATIONS_PER_TOKEN.message).toContain('5,000 evaluations');
    expect(EVALUATIONS_PER_USER.points).toBe(9000);
    expect(EVALUATIONS_PER_USER.countAhead).toBe(50); // 1 % would be 90: blocks stop at 50
  });

  it.each(['0', '-5', '1.5', 'lots'])('refuse %j at start, naming the variable, rather than read it as no limit', async (raw) => {
    vi.stubEnv('NOOKPASS_EVALUATIONS_PER_USER_PER_MINUTE', raw);
    await expect(load()).rejects.toThrow(/NOOKPASS_EVALUATIONS_PER_USER_PER_MINUTE must be a positive whole number/);
  });
});
