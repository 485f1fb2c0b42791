import { SaxesParser } from "saxes";
import { generatePart } from "./scripts/bench/reader";
import { readScoreFile } from "./lib/musicxml";
const text = generatePart(100000);
const bytes = new TextEncoder().encode(text);
function t(name: string, f: () => void) { const ts=[]; for (let i = 0; i < 5; i++) { const a = performance.now(); f(); ts.push(performance.now() - a); } ts.sort((a,b)=>a-b); console.log(name, ts[2].toFixed(0)); return ts[2]; }
const c = t("count", () => { const p = new SaxesParser({ position: false, xmlns: false }); let c = 0; p.on("opentag", () => void c++); p.write(text).close(); });
const r = t("read", () => readScoreFile(bytes, "x", { maxFileBytes: Infinity }));
console.log("ratio", (r / c).toFixed(2));
