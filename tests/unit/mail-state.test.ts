import { describe, expect, it } from 'vitest';
import { mailDeliveryProps, mailState } from '@/lib/domain/mail/outbox';

const base = { attempts: 0, maxAttempts: 4, lastError: null };

describe('the words shown beside an e-mail', () => {
  it('reads queued → sent', () => {
    expect(mailState({ ...base, status: 'queued' })).toEqual({ label: 'queued', tone: 'pending', canSendAgain: false });
    expect(mailState({ ...base, status: 'sending', attempts: 1 }).label).toBe('sending');
    expect(mailState({ ...base, status: 'sent', attempts: 1 })).toEqual({ label: 'sent', tone: 'done', canSendAgain: false });
  });

  it('counts the attempts while retrying, and offers "send again" only after the last', () => {
    const retrying = mailState({ ...base, status: 'retrying', attempts: 2, lastError: 'relay down' });
    expect(retrying).toEqual({ label: 'failed, retrying (2 of 4 attempts made)', tone: 'problem', canSendAgain: false });
    expect(mailState({ ...base, status: 'sending', attempts: 3 }).label).toBe('sending (attempt 3)');
    expect(mailState({ ...base, status: 'failed', attempts: 4 })).toEqual({ label: 'not sent after 4 attempts', tone: 'problem', canSendAgain: true });
    expect(mailState({ ...base, status: 'failed', attempts: 1 }).label).toBe('not sent after 1 attempt');
  });

  it('hands the browser no more than the state', () => {
    const full = { id: 'm1', status: 'sent' as const, attempts: 1, maxAttempts: 4, lastError: null, to: 'someone@example.test', subject: 's' };
    expect(Object.keys(mailDeliveryProps(full)).sort()).toEqual(['attempts', 'id', 'lastError', 'maxAttempts', 'status']);
  });
});
