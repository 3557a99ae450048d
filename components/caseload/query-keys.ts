import type { CaseloadQuery } from "@/lib/validations/caseload";

// TanStack Query keys for the caseload; invalidate by prefix (caseloadKeys.all) after a change.
export const caseloadKeys = {
  all: ["caseload"] as const,
  lists: () => [...caseloadKeys.all, "list"] as const,
  list: (query: CaseloadQuery) => [...caseloadKeys.lists(), query] as const,
};
