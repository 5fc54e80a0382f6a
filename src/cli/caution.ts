/**
 * The one caution line the command line ends with wherever it speaks of
 * transmit power, EIRP or path loss (BRIEF: planning estimates; regulatory
 * limits vary by country; a site survey, local codes and licensed practice
 * decide). Printed in full, never cut to a table column.
 */
export const CLI_CAUTION =
  "Caution: planning estimates only; they do not replace a site survey. Transmit power, EIRP and channel use are regulated " +
  "and the limits vary by country; RF exposure limits protect people. Local regulations, codes and licensed practice decide.";

/** The functions whose results speak of power or path loss, as written in a formula or in a saved workbook. */
const RF_CALL = /(?:\bAIRTALLY\.|\b_xldudf_AIRTALLY_)(?:REACH|TOPLINK|INDOORLOSS|FSPL)\s*\(/i;

/** True when an evaluated formula calls REACH, TOPLINK, INDOORLOSS or FSPL. */
export function speaksOfPower(formula: string): boolean {
  return RF_CALL.test(formula);
}
