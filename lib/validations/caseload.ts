// The caseload's query string: page, page size (at most 100), search, one filter, sort, direction.
import { z } from "zod";
import { queryInt } from "./number";

export const caseloadFilters = ["overdue", "due-soon", "urgent", "twoc", "follow-up"] as const;
export type CaseloadFilter = (typeof caseloadFilters)[number];
export const caseloadSorts = ["name", "next-change", "review", "days-inserted"] as const;
export type CaseloadSort = (typeof caseloadSorts)[number];
export const CASELOAD_MAX_PAGE_SIZE = 100;
export const CASELOAD_DEFAULT_PAGE_SIZE = 25;

// Empty values in a query string mean "not set".
const blank = (v: unknown) => (v === "" || v === null ? undefined : v);

export const caseloadViewSchema = z.object({
  q: z.preprocess(blank, z.string().trim().max(100).optional()).transform((v) => (v ? v : undefined)),
  filter: z.preprocess(blank, z.enum(caseloadFilters).optional()),
  sort: z.preprocess(blank, z.enum(caseloadSorts).default("next-change")),
  dir: z.preprocess(blank, z.enum(["asc", "desc"]).default("asc")),
});

export const caseloadQuerySchema = caseloadViewSchema.extend({
  page: queryInt(1, 100_000, 1),
  pageSize: queryInt(1, CASELOAD_MAX_PAGE_SIZE, CASELOAD_DEFAULT_PAGE_SIZE),
});

export type CaseloadView = z.output<typeof caseloadViewSchema>;
export type CaseloadQuery = z.output<typeof caseloadQuerySchema>;
export type CaseloadQueryInput = z.input<typeof caseloadQuerySchema>;

export const pageQuerySchema = z.object({
  page: queryInt(1, 100_000, 1),
  pageSize: queryInt(1, 100, 25),
});
