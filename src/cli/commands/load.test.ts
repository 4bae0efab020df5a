/**
 * The load progress line (pure function; the CLI draws it on stderr only on a terminal).
 * Expected strings hand-computed from the inputs.
 */
import { describe, expect, it } from "vitest";
import { progressLine } from "./load.js";

describe("progressLine", () => {
  it("shows the file, a bar for bytes read, the statement count and the rate", () => {
    const line = progressLine({ file: "big.nt", fileIndex: 0, fileCount: 1, bytes: 250, totalBytes: 1000, statements: 300_000, elapsedMs: 2000 }, 8);
    // 250/1000 = 25 % → 2 of 8 cells; 300,000 statements / 2 s = 150,000/s
    expect(line).toBe("loading big.nt [##------] 25%  300,000 statements  150,000/s");
  });

  it("names the file's place among several and caps the bar at 100 %", () => {
    const line = progressLine({ file: "b.csv", fileIndex: 1, fileCount: 3, bytes: 12, totalBytes: 10, statements: 5, elapsedMs: 0 }, 4);
    expect(line).toBe("loading b.csv (file 2/3) [####] 100%  5 statements  0/s");
  });
});
