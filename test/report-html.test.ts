/**
 * The HTML report as text: self-contained (no network references), every label escaped, the
 * one inline script pinned by its SHA-256 in the Content-Security-Policy (recomputed here with
 * node:crypto), one drawing per question that has something to draw.
 */
import { createHash } from "node:crypto";
import { describe, expect, it } from "vitest";
import { checkHtml, escapeHtml, renderCheckHtml } from "../src/present/report-html.js";
import { compareReports } from "../src/present/compare.js";
import { REPORT } from "./fixtures/report-fixtures.js";

describe("HTML report", async () => {
  const html = await checkHtml(REPORT);

  it("escapes every label, id and question (a `<script>` label stays text)", () => {
    expect(escapeHtml(`<a href="x">'&'</a>`)).toBe("&lt;a href=&quot;x&quot;&gt;&#39;&amp;&#39;&lt;/a&gt;");
    expect(html.match(/<script/g)).toHaveLength(1); // the page's own sorting script only
    expect(html).not.toContain("<img");
    expect(html).not.toContain("<b>");
    expect(html).toContain("&lt;script&gt;alert(1)&lt;/script&gt;");
    expect(html).toContain("&lt;img src=x onerror=alert(2)&gt;");
  });

  it("references nothing outside the file", () => {
    expect(html).not.toMatch(/<link\b/i);
    const tags = html.replace(/"[^"]*"/g, '""'); // attribute values are escaped text; look at the markup
    expect(tags).not.toMatch(/<[^>]*\ssrc\s*=/i); // no src attribute on any tag
    expect(html).not.toMatch(/@import|url\(/i);
    const hrefs = [...html.matchAll(/href="([^"]*)"/g)].map((m) => m[1]!);
    expect(hrefs.length).toBeGreaterThan(0);
    for (const h of hrefs) expect(h).toMatch(/^#/);
  });

  it("allows only its own script, by hash", () => {
    const script = /<script>([\s\S]*?)<\/script>/.exec(html)![1]!;
    const hash = createHash("sha256").update(script, "utf8").digest("base64");
    expect(html).toContain(`script-src 'sha256-${hash}'`);
    expect(html).toContain("default-src 'none'");
  });

  it("has the summary, the table, and per question the mentions, paths and a drawing", () => {
    expect(html).toContain('<section id="summary">');
    expect(html).toMatch(/<div class="tile-value">0\.667<\/div><div class="tile-name">Hits@1/);
    expect(html.match(/<tr><td class="num" data-key="\d+">/g)).toHaveLength(4);
    expect(html.match(/<article class="question"/g)).toHaveLength(4);
    expect(html.match(/<svg/g)).toHaveLength(3); // line 6 linked nothing: "Nothing to draw."
    expect(html).toContain("Nothing to draw.");
    expect(html).toMatch(/Lorn Yard<\/span> <span class="arrow">←<\/span><span class="rel" title="r:built">built<\/span>/);
    // drawings of several questions on one page do not share element ids
    const ids = [...html.matchAll(/<g id="([^"]+)"/g)].map((m) => m[1]!);
    expect(new Set(ids).size).toBe(ids.length);
  });

  it("prints a weak verdict's reason once in its question (not again as a flag)", () => {
    // the fixture's weak question (test/fixtures/report-fixtures.ts): reason "small lead <b>"
    const weak = REPORT.results.find((r) => r.answer.verdict.status === "weak")!;
    const article = new RegExp(`<article class="question" id="q-${weak.line}">[\\s\\S]*?</article>`).exec(html)![0];
    expect(article.match(/small lead &lt;b&gt;/g)).toHaveLength(1);
    expect(article).toContain('<p class="reason">small lead &lt;b&gt;</p>');
  });

  it("labels a verdict-bar segment only when its label fits; the counts below name every verdict", async () => {
    const skewed = { ...REPORT, summary: { ...REPORT.summary, questions: 100, verdicts: { unique: 97, tied: 1, weak: 1, none: 1 } } };
    const page = await checkHtml(skewed);
    const bar = /<div class="bar">([\s\S]*?)<\/div>/.exec(page)![1]!;
    expect(bar).toContain(">unique 97</span>");
    // 1 % of 760 px is 7.6 px: no room for "tied 1" (6 characters)
    expect(bar).toMatch(/<span class="seg v-tied bare" style="width:1\.00%" title="tied: 1"><\/span>/);
    expect(page).toMatch(/<p><span class="badge v-unique">unique<\/span> 97 <span class="badge v-tied">tied<\/span> 1/);
  });

  it("shows suggested clues when the answer document carries them", async () => {
    const withSugg = { ...REPORT, results: [{ ...REPORT.results[1]!, answer: { ...REPORT.results[1]!.answer, suggestions: [{ text: "that is funded by Tallow Fund" }] } }] };
    const page = renderCheckHtml(withSugg, [null]);
    expect(page).toContain("<h4>Suggested clues</h4><ul class=\"suggestions\"><li>that is funded by Tallow Fund</li>");
  });

  it("includes the comparison with an earlier run", () => {
    const page = renderCheckHtml(REPORT, [null, null, null, null], { comparison: compareReports(REPORT, REPORT) });
    expect(page).toContain('<section id="changes">');
    expect(page).toContain("0 new misses");
  });

  it("refuses a drawing list of the wrong length", () => {
    expect(() => renderCheckHtml(REPORT, [])).toThrow(RangeError);
  });
});
