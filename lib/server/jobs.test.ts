import { describe, expect, it } from "vitest";
import { CATALOGUING_WINDOW_MS, cataloguingJob, cataloguingWindowMs } from "./jobs";

describe("cataloguing windows", () => {
  it("requests within one window share a job that runs just after the window closes", () => {
    const t = 1_000_000 * CATALOGUING_WINDOW_MS + 200;
    const a = cataloguingJob("lib", t);
    const b = cataloguingJob("lib", t + CATALOGUING_WINDOW_MS - 300);
    expect(a.jobId).toBe(b.jobId);
    expect(a.delay).toBe(CATALOGUING_WINDOW_MS - 200 + 100);
    expect(cataloguingJob("lib", t + CATALOGUING_WINDOW_MS).jobId).not.toBe(a.jobId);
  });

  it("widens with the cost of the last cataloguing, in whole base windows, up to a minute", () => {
    expect(cataloguingWindowMs(undefined)).toBe(CATALOGUING_WINDOW_MS);
    expect(cataloguingWindowMs(100)).toBe(CATALOGUING_WINDOW_MS);
    expect(cataloguingWindowMs(1900)).toBe(Math.ceil(7600 / CATALOGUING_WINDOW_MS) * CATALOGUING_WINDOW_MS);
    expect(cataloguingWindowMs(1900) % CATALOGUING_WINDOW_MS).toBe(0);
    expect(cataloguingWindowMs(600_000)).toBe(60_000);
    const w = cataloguingWindowMs(5000);
    const t = 7 * w + 10;
    expect(cataloguingJob("lib", t, w).jobId).toBe(cataloguingJob("lib", t + w - 20, w).jobId);
  });
});
