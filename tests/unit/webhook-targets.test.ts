import { describe, expect, it } from 'vitest';
import { webhookUrlShapeProblem } from '@/lib/domain/webhooks/schema';
import { addressProblem, webhookTargetProblem } from '@/lib/platform/webhooks/targets';

describe('where webhooks may go', () => {
  it('takes public https addresses', () => {
    for (const url of ['https://hooks.example.com/nookpass', 'https://93.184.215.14/in', 'https://[2606:4700::1111]/x']) {
      expect(webhookTargetProblem(url, false), url).toBeNull();
    }
  });

  it('refuses plain http unless local receivers are allowed and the host is this machine', () => {
    expect(webhookTargetProblem('http://hooks.example.com/x', false)).toMatch(/https:\/\//);
    expect(webhookTargetProblem('http://hooks.example.com/x', true)).toMatch(/https:\/\//);
    expect(webhookTargetProblem('http://127.0.0.1:4999/x', false)).toMatch(/https:\/\//);
    expect(webhookTargetProblem('http://127.0.0.1:4999/x', true)).toBeNull();
    expect(webhookTargetProblem('http://localhost:4999/x', true)).toBeNull();
    expect(webhookTargetProblem('http://[::1]:4999/x', true)).toBeNull();
  });

  it('refuses loopback in production and private, link-local and reserved ranges always', () => {
    // RFC 1122 3.2.1.3 (127/8), RFC 6761 6.3 (localhost), RFC 4291 (::1, fe80::/10), RFC 1918, RFC 3927 (169.254/16),
    // RFC 6598 (100.64/10), RFC 4193 (fc00::/7).
    expect(webhookTargetProblem('https://127.0.0.1/x', false)).toMatch(/loopback/);
    expect(webhookTargetProblem('https://app.localhost/x', false)).toMatch(/localhost/);
    for (const host of ['10.1.2.3', '172.16.0.1', '172.31.255.255', '192.168.1.1', '169.254.169.254', '100.64.0.1', '0.0.0.0', '[fd00::1]', '[fe80::1]', '[::ffff:10.0.0.1]', '[::]', '224.0.0.1']) {
      expect(webhookTargetProblem(`https://${host}/x`, true), host).toMatch(/private, link-local or reserved/);
    }
    // Edges of 172.16.0.0/12: just outside is public.
    expect(webhookTargetProblem('https://172.32.0.1/x', false)).toBeNull();
    expect(webhookTargetProblem('https://172.15.255.255/x', false)).toBeNull();
    // Other spellings of an address are read as the WHATWG URL parser reads them (0x7f.1 is 127.0.0.1).
    expect(webhookTargetProblem('https://0x7f.1/x', false)).toMatch(/loopback/);
    expect(webhookTargetProblem('https://2852039166/x', true)).toMatch(/private, link-local or reserved/); // 169.254.169.254
  });

  it('checks resolved addresses the same way', () => {
    expect(addressProblem('10.0.0.7', true)).toMatch(/private/);
    expect(addressProblem('::ffff:127.0.0.1', false)).toMatch(/loopback/);
    expect(addressProblem('::ffff:127.0.0.1', true)).toBeNull();
    expect(addressProblem('8.8.8.8', false)).toBeNull();
  });

  it('asks for a plain address shape first', () => {
    expect(webhookUrlShapeProblem('hooks.example.com')).toMatch(/full address/);
    expect(webhookUrlShapeProblem('ftp://hooks.example.com/')).toMatch(/https/);
    expect(webhookUrlShapeProblem('https://user:pw@hooks.example.com/')).toMatch(/user name and password/);
    expect(webhookUrlShapeProblem('https://hooks.example.com/#x')).toMatch(/fragment/);
    expect(webhookUrlShapeProblem('https://hooks.example.com/in?team=7')).toBeNull();
  });
});
