/** How documents name their revision: the submission they are, or the draft of the next one. */

/** "rev 2" for a submitted revision; "rev 2 draft (not submitted)" for the live job before its next submission. */
export function revisionText(revision: number, draft: boolean): string {
	return draft ? `rev ${revision} draft (not submitted)` : `rev ${revision}`;
}
