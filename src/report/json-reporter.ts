/**
 * The JSON report: the whole CheckReport (model stats, solver figures, modes without their
 * shapes, each rule's outcome with measured value, limit and details), with a schema version so
 * later tools (HTML report, baseline comparison) can read it. Non-finite numbers become strings.
 */
import type { CheckReport } from '../pipeline/result-types.js';

const JSON_REPORT_VERSION = 1;

export function formatJson(report: CheckReport): string {
  const doc = { reportVersion: JSON_REPORT_VERSION, ...report };
  return `${JSON.stringify(doc, replacer, 2)}\n`;
}

function replacer(_key: string, value: unknown): unknown {
  if (typeof value === 'number' && !Number.isFinite(value)) return String(value);
  if (value instanceof Float64Array || value instanceof Int32Array || value instanceof Uint8Array) return Array.from(value);
  return value;
}
