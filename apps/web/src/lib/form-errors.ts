import type { z } from 'zod';

/** zod issues as the API's `fields` shape: dot-joined path → first message. */
export function fieldsFromIssues(issues: readonly z.core.$ZodIssue[]): Record<string, string> {
  const fields: Record<string, string> = {};
  for (const issue of issues) {
    const path = issue.path.map(String).join('.');
    fields[path] ??= issue.message;
  }
  return fields;
}
