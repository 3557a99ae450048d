// The per-account delay's arithmetic: the bounds docs/security.md states (OWASP Authentication
// Cheat Sheet: exponential lockout starting at one second; ASVS 5.0.0 6.1.1 documents them).
import { describe, expect, it } from "vitest";
import { ACCOUNT_LIMITS, applyAttempt, delayAfter, emptyState } from "@/lib/auth/sign-in-throttle";

const t0 = new Date("2026-12-02T10:00:00Z");
const at = (seconds: number) => new Date(t0.getTime() + seconds * 1000);

describe("delayAfter", () => {
  it("lets the first four wrong passwords in a row through, then waits 1 s, doubling, to 15 min at most", () => {
    expect([1, 2, 3, 4].map(delayAfter)).toEqual([0, 0, 0, 0]);
    expect([5, 6, 7, 8, 9, 10].map(delayAfter)).toEqual([1, 2, 4, 8, 16, 32]);
    expect(delayAfter(14)).toBe(512);
    expect(delayAfter(15)).toBe(ACCOUNT_LIMITS.maxDelaySeconds);
    expect(delayAfter(1000)).toBe(15 * 60);
  });

  it("allows at most about 111 checked guesses a day against one account once the wait is at its longest", () => {
    // 15 checks to reach the cap (their waits add up to 1 023 s), then one every 15 minutes.
    let seconds = 0;
    let guesses = 0;
    while (seconds < 24 * 60 * 60) {
      guesses += 1;
      seconds += delayAfter(guesses);
    }
    expect(guesses).toBeGreaterThan(100);
    expect(guesses).toBeLessThanOrEqual(111);
  });
});

describe("applyAttempt", () => {
  it("a held attempt counts for the report but never lengthens the wait", () => {
    let s = emptyState(t0);
    for (let i = 0; i < 6; i++) s = applyAttempt(s, { kind: "password", addressHash: `a${i}`, now: at(i) }).next;
    const blocked = s.blockedUntil!;
    const held = applyAttempt(s, { kind: "held", addressHash: "z", now: at(7) }).next;
    expect(held.blockedUntil).toEqual(blocked);
    expect(held).toMatchObject({ consecutiveFailures: 6, failedAttempts: 6, heldAttempts: 1 });
    expect(held.addressHashes).toHaveLength(7);
  });

  it("tells the owner at the 10th attempt of a day, not again the same day, and again the next day", () => {
    let s = emptyState(t0);
    const due: number[] = [];
    for (let i = 1; i <= 30; i++) {
      const r = applyAttempt(s, { kind: i % 2 ? "password" : "held", addressHash: "a", now: at(i) });
      if (r.noticeDue) due.push(i);
      s = r.next;
    }
    expect(due).toEqual([10]);
    // Twenty-three hours later the same run goes on: no second e-mail yet.
    expect(applyAttempt(s, { kind: "held", addressHash: "a", now: at(23 * 3600) }).noticeDue).toBe(false);
  });

  it("forgets a run after 24 h without attempts and starts a new report", () => {
    let s = emptyState(t0);
    for (let i = 0; i < 8; i++) s = applyAttempt(s, { kind: "password", addressHash: "a", now: at(i) }).next;
    const later = applyAttempt(s, { kind: "password", addressHash: "b", now: at(25 * 3600) }).next;
    expect(later).toMatchObject({ consecutiveFailures: 1, failedAttempts: 1, heldAttempts: 0, addressHashes: ["b"], blockedUntil: null });
  });

  it("counts wrong second-step codes apart, and in the run", () => {
    const s = applyAttempt(emptyState(t0), { kind: "second_step", addressHash: "a", now: t0 }).next;
    expect(s).toMatchObject({ consecutiveFailures: 1, failedAttempts: 1, secondStepFailures: 1 });
  });
});
