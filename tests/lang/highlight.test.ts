import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { highlightToHtml } from "../../lib/lang/index";

const text = (html: string) =>
  html.replace(/<[^>]+>/g, "").replace(/&lt;/g, "<").replace(/&gt;/g, ">").replace(/&quot;/g, '"').replace(/&amp;/g, "&");

describe("highlightToHtml", () => {
  it("keeps the text exactly and leaves no raw markup characters (any input)", () => {
    fc.assert(
      fc.property(fc.string({ maxLength: 80 }), (s) => {
        const html = highlightToHtml(s);
        expect(text(html)).toBe(s);
        expect(html.replace(/<\/?span[^>]*>/g, "")).not.toMatch(/[<>"]/);
      }),
      { numRuns: 500 },
    );
  });
  it("marks keywords, NOT signs and comments", () => {
    const html = highlightToHtml("inputs a // x\nf = a'");
    expect(html).toContain('<span class="text-accent font-semibold">inputs</span>');
    expect(html).toContain('<span class="text-graphite italic">// x</span>');
    expect(html).toContain('<span class="text-amber font-semibold">\'</span>');
  });
});
