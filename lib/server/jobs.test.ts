import { describe, expect, it } from "vitest";
import { REGROUP_WINDOW_MS, regroupJob, regroupWindowMs } from "./jobs";

describe("regroup windows", () => {
  it("requests within one window share a job that runs just after the window closes", () => {
    const t = 1_000_000 * REGROUP_WINDOW_MS + 200;
    const a = regroupJob("lib", t);
    const b = regroupJob("lib", t + REGROUP_WINDOW_MS - 300);
    expect(a.jobId).toBe(b.jobId);
    expect(a.delay).toBe(REGROUP_WINDOW_MS - 200 + 100);
    expect(regroupJob("lib", t + REGROUP_WINDOW_MS).jobId).not.toBe(a.jobId);
  });

  it("widens with the cost of the last regroup, in whole base windows, up to a minute", () => {
    expect(regroupWindowMs(undefined)).toBe(REGROUP_WINDOW_MS);
    expect(regroupWindowMs(100)).toBe(REGROUP_WINDOW_MS);
    expect(regroupWindowMs(1900)).toBe(Math.ceil(7600 / REGROUP_WINDOW_MS) * REGROUP_WINDOW_MS);
    expect(regroupWindowMs(1900) % REGROUP_WINDOW_MS).toBe(0);
    expect(regroupWindowMs(600_000)).toBe(60_000);
    const w = regroupWindowMs(5000);
    const t = 7 * w + 10;
    expect(regroupJob("lib", t, w).jobId).toBe(regroupJob("lib", t + w - 20, w).jobId);
  });
});
