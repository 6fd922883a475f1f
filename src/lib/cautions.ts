/** The cautions shown wherever someone may go near a panel, and the limits of what Ampledger claims. */

/** Beside the homeowner's panel map and on the directory card. */
export const PANEL_CAUTION =
	'Switch the breaker off and verify with a tester before any work. Work inside a panelboard is for licensed electricians.';

/** Beside the load calculation and in the page footer. */
export const LIMITS_NOTICE =
	'Ampledger helps prepare and check documents; it does not certify a design. Local codes, the AHJ’s amendments and licensed practice decide.';
