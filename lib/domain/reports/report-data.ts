import type { Editions } from '@/lib/domain/editions';
import type { EvaluationSummary, Finding } from '@/lib/domain/engine';
import type { RuleSetParameters } from '@/lib/domain/params';
import type { Plan } from '@/lib/domain/plan';

/** Everything the report shows, gathered before rendering so the PDF is a pure function of it. */
export type ReportData = {
  code: string;
  verifyUrl: string;
  generatedAt: Date;
  project: { name: string; siteAddress: string; permitNumber: string | null; isDemo: boolean };
  organization: { name: string; licenseNumber: string | null };
  jurisdiction: {
    name: string;
    region: string;
    editions: Editions;
    amendmentNotes: string;
    /** IANA zone every date in the report is printed in (lib/domain/dates/format). */
    timeZone: string;
  };
  ruleSet: { version: number; publishedAt: Date | null; changelog: string };
  planRevision: { number: number; savedBy: string | null; savedAt: Date };
  check: { id: string; createdAt: Date; runBy: string | null; summary: EvaluationSummary; outcome: string };
  findings: Finding[];
  plan: Plan;
  /** Why the drawings are left out: a stored plan over today's list limits is not drawn. */
  drawingsWithheld?: string[];
  parameters: RuleSetParameters;
  /** Per rule key: when the jurisdiction checked the citation against its adopted text (that citation's text). */
  citationChecks?: Record<string, { citation: string; checkedOn: string }>;
  /** `addedAt`: when the file was attached to the project. */
  photos: { caption: string; filename: string; image: Buffer; width: number; height: number; addedAt?: Date }[];
  documents: { caption: string; filename: string; contentType: string; addedAt?: Date }[];
  preparedBy: string;
};
