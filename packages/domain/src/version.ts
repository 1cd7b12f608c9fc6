/**
 * Version of the clinical rule set implemented by this package.
 * The API stores it beside each computed verdict so a verdict can be traced
 * to the rules that produced it. Bump it whenever a rule, threshold or default changes.
 */
export const RULES_VERSION = '2026.12.3';
