import type { Page } from "playwright-core";

/**
 * Layout checks run in the page. They are plain JavaScript strings, not functions: the test bundler wraps named
 * functions in a helper the browser does not have.
 */

/** Page wider than the viewport: the page width and the elements that stick out or do not shrink. */
const overflowSource = `(() => {
  const width = document.documentElement.clientWidth;
  const past = [...document.querySelectorAll("body *")].filter((el) => el.getBoundingClientRect().right > width + 1 && el.children.length === 0);
  const stretched = [...document.querySelectorAll("body *")].filter((el) => {
    if (el.getBoundingClientRect().width <= width + 1) return false;
    for (let up = el.parentElement; up && up !== document.body; up = up.parentElement) if (getComputedStyle(up).overflowX !== "visible") return false;
    return true;
  });
  const deepest = stretched.filter((el) => !stretched.some((other) => other !== el && el.contains(other)));
  const wide = [...deepest.slice(0, 3), ...past.slice(0, 3)].map((el) => el.tagName.toLowerCase() + "." + String(el.className).slice(0, 60) + " \\"" + (el.textContent ?? "").slice(0, 40) + "\\"");
  return { scroll: document.documentElement.scrollWidth, client: width, wide };
})()`;

/**
 * Numbers torn from their units: every "number unit" (1.4 M☉, 12 %, 3 min, 40 Mpc, 120 deg², 05:30 GMT-3, …) in the
 * main content whose text lies on more than one line. Text inside screen-reader-only boxes is skipped.
 */
const unitBreaksSource = `(() => {
  const unit = "(?:M☉|Mpc|Gpc|deg²|Hz|kHz|%|ms|s|min|h|d|km|years?|days?)";
  const number = "[−-]?\\\\d[\\\\d.,]*";
  const re = new RegExp(number + "(?:[ \\\\u00a0]±[ \\\\u00a0]" + number + ")?[ \\\\u00a0]" + unit + "(?![\\\\p{L}\\\\d])|\\\\d{2}:\\\\d{2}(?::\\\\d{2})?[ \\\\u00a0](?:UTC|GMT[+\\\\-−]\\\\d{1,2}(?::\\\\d{2})?)", "gu");
  const seen = new WeakMap();
  const broken = [];
  const root = document.querySelector("main") ?? document.body;
  for (const el of root.querySelectorAll("*")) {
    if (el.closest(".sr-only, svg, [aria-hidden=true]")) continue;
    const display = getComputedStyle(el).display;
    if (display.startsWith("inline") || display === "none" || display === "contents") continue;
    const text = el.textContent ?? "";
    if (text.length > 400 || !/\\d/.test(text)) continue;
    const nodes = [];
    const walker = document.createTreeWalker(el, NodeFilter.SHOW_TEXT);
    for (let n = walker.nextNode(); n; n = walker.nextNode()) nodes.push(n);
    const starts = [];
    let total = 0;
    for (const n of nodes) { starts.push(total); total += n.data.length; }
    const full = nodes.map((n) => n.data).join("");
    for (const m of full.matchAll(re)) {
      const at = (offset) => {
        let i = 0;
        while (i + 1 < nodes.length && starts[i + 1] <= offset) i += 1;
        return [nodes[i], offset - starts[i]];
      };
      const [startNode, startOffset] = at(m.index);
      const [endNode, endOffset] = at(m.index + m[0].length - 1);
      // Only pieces inside this one block: text that merely follows in the next cell or block is not a unit.
      const blockOf = (node) => {
        for (let up = node.parentElement; up; up = up.parentElement) {
          const d = getComputedStyle(up).display;
          if (!d.startsWith("inline") && d !== "contents") return up;
        }
        return null;
      };
      if (blockOf(startNode) !== el || blockOf(endNode) !== el) continue;
      const done = seen.get(startNode) ?? new Set();
      if (done.has(startOffset)) continue;
      done.add(startOffset);
      seen.set(startNode, done);
      const range = document.createRange();
      range.setStart(startNode, startOffset);
      range.setEnd(endNode, endOffset + 1);
      const rects = [...range.getClientRects()].filter((r) => r.width > 0 && r.height > 0);
      const lines = rects.some((a) => rects.some((b) => b.top >= a.bottom - 1));
      const holder = range.commonAncestorContainer.nodeType === 1 ? range.commonAncestorContainer : range.commonAncestorContainer.parentElement;
      if (lines) broken.push("“" + m[0] + "” in " + (holder?.tagName ?? "?").toLowerCase() + "." + String(holder?.className ?? "").slice(0, 50));
    }
  }
  return broken;
})()`;

/** The problem, naming the culprits, when the page is wider than its viewport; null when it fits. */
export async function overflowProblem(page: Page, what: string): Promise<string | null> {
  const { scroll, client, wide } = (await page.evaluate(overflowSource)) as { scroll: number; client: number; wide: string[] };
  return scroll > client ? `${what}: page is ${scroll} px wide in a ${client} px viewport; past the edge: ${wide.join(" | ")}` : null;
}

/** The problem, naming the pieces, when a number and its unit (or a clock time and its zone) are split over two lines. */
export async function unitBreakProblem(page: Page, what: string): Promise<string | null> {
  const broken = (await page.evaluate(unitBreaksSource)) as string[];
  return broken.length > 0 ? `${what}: ${broken.length} number(s) split from their unit: ${broken.slice(0, 8).join(" | ")}` : null;
}
