import fs from "node:fs";
import { createRequire } from "node:module";
import type { Page } from "playwright-core";

const require = createRequire(import.meta.url);
let source: string | undefined;

/** WCAG 2.0 and 2.1, levels A and AA (axe-core's tags for them). */
export const WCAG_21_AA = ["wcag2a", "wcag2aa", "wcag21a", "wcag21aa"];

export interface AxeViolation {
  id: string;
  impact: string | null;
  help: string;
  targets: string[];
}

/**
 * Runs axe-core (from the npm registry, evaluated in the page) over the page as it stands, with
 * the WCAG 2.1 A and AA rules, including the ones axe marks experimental under those tags (such
 * as css-orientation-lock: Ondula must work in both orientations).
 */
export async function axeViolations(page: Page): Promise<AxeViolation[]> {
  source ??= fs.readFileSync(require.resolve("axe-core/axe.min.js"), "utf8");
  // Evaluated through the DevTools protocol rather than added as a <script>: the page's
  // Content-Security-Policy (a nonce per request) rightly refuses an injected inline script.
  if (!(await page.evaluate(() => "axe" in window))) await page.evaluate(`${source}\n;void 0`);
  return page.evaluate(async (tags) => {
    const axe = (window as unknown as { axe: typeof import("axe-core") }).axe;
    const experimental = axe.getRules(tags).filter((r) => r.tags.includes("experimental")).map((r) => r.ruleId);
    const result = await axe.run(document, {
      runOnly: { type: "tag", values: tags },
      rules: Object.fromEntries(experimental.map((id) => [id, { enabled: true }])),
      resultTypes: ["violations"],
    });
    return result.violations.map((v) => ({
      id: v.id,
      impact: v.impact ?? null,
      help: v.help,
      targets: v.nodes.map((n) => `${n.target.join(" ")} — ${n.failureSummary?.split("\n").slice(1).join(" ").trim() ?? ""}`),
    }));
  }, WCAG_21_AA);
}
