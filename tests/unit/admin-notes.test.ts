import { describe, expect, it } from 'vitest';
import { withoutAdminNotes } from '@/lib/domain/engine';
import { CHECK_SCHEMA_VERSION, readStoredCheck } from '@/lib/domain/checks/stored';
import { adminNotesFor, LOCAL_SECTION_ADMIN_NOTE } from '@/lib/domain/rule-format';
import { buildRuleSet, type RuleSetOverrides } from '@/rules';
import { check, EDITIONS_2018, finding, variant } from './support/check';

// A drain pan where leakage can damage the structure, by local amendment (invented for the test), its section not entered.
const panWithoutSection: RuleSetOverrides = { parameters: { plumbing: { drainPanPolicy: 'over-finished-space' } } };
const noPanOverFinishedSpace = variant((p) => {
  p.space.overFinishedSpace = true;
  p.plumbing.drainPan = null;
});

describe('notes for rule-set admins stay with admins', () => {
  it('the installer’s finding says what to do; the note on what to fix in the rule set is apart', async () => {
    const evaluation = await check(noPanOverFinishedSpace, EDITIONS_2018, panWithoutSection);
    const pan = finding(evaluation, 'plumbing.drain-pan');
    expect(pan.status).toBe('fail');
    expect(pan.adminNote).toBe(LOCAL_SECTION_ADMIN_NOTE);
    for (const text of [pan.citationNote, pan.note, pan.message, pan.remedy]) expect(text ?? '').not.toMatch(/rule set parameters/);
    expect(pan.citationNote).toContain('the AHJ can say which section applies');
  });

  it('installers receive findings without admin notes', async () => {
    const evaluation = withoutAdminNotes(await check(noPanOverFinishedSpace, EDITIONS_2018, panWithoutSection));
    expect(evaluation.findings.every((f) => !('adminNote' in f))).toBe(true);
    expect(JSON.stringify(evaluation)).not.toMatch(/rule set parameters/);
  });

  it('rule-set screens list each rule’s admin note', () => {
    const { rules } = buildRuleSet(EDITIONS_2018, panWithoutSection);
    expect(adminNotesFor(rules)).toContainEqual({ ruleKey: 'plumbing.drain-pan', title: expect.any(String), note: LOCAL_SECTION_ADMIN_NOTE });
    const withSection = buildRuleSet(EDITIONS_2018, { parameters: { plumbing: { drainPanPolicy: 'over-finished-space', drainPanSection: '406.3' } } });
    expect(adminNotesFor(withSection.rules).map((n) => n.ruleKey)).not.toContain('plumbing.drain-pan');
  });

  it('a check stored at version 2 with the admin note in its finding reads without it', () => {
    const stored = {
      inputs: { plan: { units: 'imperial' }, canonical: { units: 'imperial' }, planSchemaVersion: 1 },
      facts: {},
      summary: { pass: 0, fail: 1, caution: 0, needsInfo: 0, notApplicable: 0 },
      findings: [
        {
          ruleKey: 'plumbing.drain-pan',
          citationNote: LOCAL_SECTION_ADMIN_NOTE,
          note: `Checked against local amendment for Demo County. The locally adopted code, its amendments and the AHJ govern; this finding is an aid, not an approval. ${LOCAL_SECTION_ADMIN_NOTE}`,
          amendments: [],
        },
      ],
    };
    expect(CHECK_SCHEMA_VERSION).toBe(3);
    const read = readStoredCheck(stored, 2) as { findings: Array<{ citationNote: string; note: string }> };
    expect(JSON.stringify(read.findings)).not.toMatch(/rule set parameters/);
    expect(read.findings[0].citationNote).toContain('the AHJ can say which section applies');
    expect(read.findings[0].note).toMatch(/^Checked against local amendment for Demo County\. .*the AHJ can say which section applies\.$/);
  });
});
