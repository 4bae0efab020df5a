/**
 * JSON rendering of `ask --json` and `check --json`: the contract documents
 * (../shared/contract.md), one per call, always carrying the disclaimer field.
 */
import { DISCLAIMER, type AskResult, type CheckReport } from "../model/index.js";

/** The `ask --json` document (pretty-printed, newline-terminated). */
export function askJson(result: AskResult): string {
  return JSON.stringify({ ...result, disclaimer: result.disclaimer ?? DISCLAIMER }, null, 2) + "\n";
}

/** The `check --json` document (pretty-printed, newline-terminated). */
export function checkJson(report: CheckReport): string {
  return JSON.stringify({ ...report, disclaimer: DISCLAIMER }, null, 2) + "\n";
}
