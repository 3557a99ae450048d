// Counts the statements a piece of code sends to PostgreSQL (every pg client's query calls), for
// the tests that hold a page or a card to a fixed number of round trips.
import pg from "pg";
import { vi } from "vitest";

export async function countQueries<T>(fn: () => Promise<T>): Promise<{ result: T; queries: number }> {
  const spy = vi.spyOn(pg.Client.prototype, "query");
  try {
    const result = await fn();
    return { result, queries: spy.mock.calls.length };
  } finally {
    spy.mockRestore();
  }
}
