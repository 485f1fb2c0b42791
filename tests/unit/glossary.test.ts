import fs from "node:fs";
import path from "node:path";
import ts from "typescript";
import { describe, expect, it } from "vitest";

/**
 * One name for each thing: no text a person reads in app/ or components/ uses a word the
 * glossary has replaced (docs/glossary-forbidden.json, kept next to the README's glossary).
 * Text a person reads: JSX text, and string or template literals that are JSX attributes or
 * children, or that read as words (contain a space) — not code identifiers like "suggestions".
 */
interface Entry {
  use: string;
  forbidden: string;
  only?: string[];
  why: string;
}

const { entries } = JSON.parse(fs.readFileSync(path.resolve("docs/glossary-forbidden.json"), "utf8")) as { entries: Entry[] };

function sourceFiles(dir: string): string[] {
  const out: string[] = [];
  for (const e of fs.readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, e.name);
    if (e.isDirectory()) out.push(...sourceFiles(p));
    else if (/\.tsx?$/.test(e.name) && !/\.(test|e2e)\.tsx?$/.test(e.name)) out.push(p);
  }
  return out;
}

/** Words on screen in one file, with their line numbers. */
function screenTexts(file: string, text: string): { line: number; text: string }[] {
  const source = ts.createSourceFile(file, text, ts.ScriptTarget.Latest, true, file.endsWith(".tsx") ? ts.ScriptKind.TSX : ts.ScriptKind.TS);
  const out: { line: number; text: string }[] = [];
  const add = (node: ts.Node, value: string) => {
    const v = value.replace(/\s+/g, " ").trim();
    if (v) out.push({ line: source.getLineAndCharacterOfPosition(node.getStart()).line + 1, text: v });
  };
  const inJsx = (node: ts.Node) => {
    for (let p = node.parent; p; p = p.parent) {
      if (ts.isJsxAttribute(p) || ts.isJsxExpression(p)) return true;
      if (ts.isBlock(p) || ts.isSourceFile(p)) return false;
    }
    return false;
  };
  const visit = (node: ts.Node) => {
    if (ts.isImportDeclaration(node) || ts.isExportDeclaration(node)) return;
    // Code, not words: keys, class names, test ids, data attributes, comparisons.
    if (ts.isJsxAttribute(node) && /^(className|key|id|href|data-|type|name|role|htmlFor|aria-(controls|describedby|labelledby))/.test(node.name.getText())) return;
    if (ts.isElementAccessExpression(node) || ts.isBinaryExpression(node) && [ts.SyntaxKind.EqualsEqualsEqualsToken, ts.SyntaxKind.ExclamationEqualsEqualsToken].includes(node.operatorToken.kind)) return;
    if (ts.isCallExpression(node) && /^(import|require|querySelector|querySelectorAll|closest|getAttribute|setAttribute|addEventListener|removeEventListener|fetch|startsWith|endsWith|includes|split|replace|test|setSideView)$/.test(node.expression.getText().split(".").pop() ?? "")) return;
    if (ts.isJsxText(node)) add(node, node.getText());
    else if (ts.isStringLiteral(node) || ts.isNoSubstitutionTemplateLiteral(node)) {
      if (inJsx(node) || /\s/.test(node.text)) add(node, node.text);
    } else if (ts.isTemplateExpression(node)) {
      // A path built for a request is not read by anyone.
      if (!node.head.text.startsWith("/")) add(node, [node.head.text, ...node.templateSpans.map((s) => s.literal.text)].join(" … "));
    }
    ts.forEachChild(node, visit);
  };
  visit(source);
  return out;
}

const files = ["app", "components"].flatMap((d) => sourceFiles(path.resolve(d)));
/** Each file read and parsed once for every entry. */
const textsByFile = new Map(files.map((f) => [path.relative(process.cwd(), f), screenTexts(f, fs.readFileSync(f, "utf8"))]));

describe("one name for each thing", () => {
  it("reads the list kept next to the glossary, and the glossary names each word the screens use", () => {
    expect(entries.length).toBeGreaterThan(5);
    const readme = fs.readFileSync(path.resolve("README.md"), "utf8");
    const glossary = readme.slice(readme.indexOf("## Glossary"), readme.indexOf("## Architecture"));
    for (const e of entries) expect(glossary.toLowerCase(), `the glossary names "${e.use}"`).toContain(e.use.toLowerCase());
  });

  it("finds a forbidden word where it is (the scanner itself)", () => {
    const texts = screenTexts("x.tsx", `export const A = () => <button aria-label={"Audition the note"} className="audition">▶ Audition</button>;\nconst k = view === "suggestions";`);
    expect(texts.map((t) => t.text)).toEqual(["Audition the note", "▶ Audition"]);
  });

  for (const entry of entries) {
    it(`says "${entry.use}", never /${entry.forbidden}/`, () => {
      const pattern = new RegExp(entry.forbidden);
      const found: string[] = [];
      for (const [rel, texts] of textsByFile) {
        if (entry.only && !entry.only.some((o) => rel.startsWith(o))) continue;
        for (const t of texts) if (pattern.test(t.text)) found.push(`${rel}:${t.line}: ${t.text}`);
      }
      expect(found, entry.why).toEqual([]);
    });
  }
});
