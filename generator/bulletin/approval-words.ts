/**
 * The sentences of the methods page about who approved a release. A release published straight
 * by `wrackline build` has none; one published by `wrackline approve` names the person and the
 * time given at approval (generator/publish/swap/approval.ts fills the sentence in).
 */
export interface Approval {
  /** Who approved it, as given on the command line. */
  by: string;
  /** When, ISO 8601 in UTC ("2026-12-01T09:30:00Z"). */
  at: string;
  /** Digest of the candidate that was reviewed. */
  candidate: string;
  /** The release on line it replaced (folder name), null when none. */
  replaced: string | null;
}

export const noApprovalSentence = 'No review and approval is recorded for this release: it was published straight from a build, without a staged candidate.';

export function approvalSentence(approval: Approval): string {
  const date = approval.at.slice(0, 10);
  const time = approval.at.slice(11, 16);
  return `Approved for publication by ${approval.by} on ${date} at ${time} UTC, from the command line (wrackline approve), after a review of candidate ${approval.candidate.slice(0, 20)}.`;
}
