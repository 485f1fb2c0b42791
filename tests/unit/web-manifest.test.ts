import fs from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";

const PUBLIC = path.resolve("public");

/** Width and height from a PNG's IHDR chunk (PNG specification, ISO/IEC 15948, 11.2.2). */
function pngSize(file: string): [number, number] {
  const b = fs.readFileSync(file);
  expect([...b.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
  expect(b.subarray(12, 16).toString("latin1")).toBe("IHDR");
  return [b.readUInt32BE(16), b.readUInt32BE(20)];
}

describe("the web app manifest", () => {
  const manifest = JSON.parse(fs.readFileSync(path.join(PUBLIC, "manifest.webmanifest"), "utf8"));

  it("names the app, starts in the library and takes its colours from the palette", () => {
    expect(manifest.name).toBe("Ondula");
    expect(manifest.start_url).toBe("/parts");
    expect(manifest.display).toBe("standalone");
    // The paper ground of tailwind.config.ts.
    const tailwind = fs.readFileSync(path.resolve("tailwind.config.ts"), "utf8");
    expect(tailwind).toContain(`paper: { DEFAULT: "${manifest.theme_color}"`);
    expect(manifest.background_color).toBe(manifest.theme_color);
  });

  it("lists icons that exist at the sizes they claim, with a maskable one (W3C Web App Manifest, icons member)", () => {
    const sizes = new Set<string>();
    for (const icon of manifest.icons as { src: string; sizes: string; type: string; purpose: string }[]) {
      const file = path.join(PUBLIC, icon.src);
      expect(fs.existsSync(file), icon.src).toBe(true);
      if (icon.type === "image/png") {
        const [w, h] = pngSize(file);
        expect(`${w}x${h}`).toBe(icon.sizes);
      }
      sizes.add(`${icon.sizes}:${icon.purpose}`);
    }
    // 192 and 512 px are what installable-app checks ask for (common practice).
    expect(sizes.has("192x192:any")).toBe(true);
    expect(sizes.has("512x512:any")).toBe(true);
    expect(sizes.has("512x512:maskable")).toBe(true);
  });

  it("has a favicon (ICO with PNG images) and a home-screen icon", () => {
    const ico = fs.readFileSync(path.join(PUBLIC, "favicon.ico"));
    expect(ico.readUInt16LE(2)).toBe(1);
    expect(ico.readUInt16LE(4)).toBeGreaterThan(0);
    expect(pngSize(path.join(PUBLIC, "apple-touch-icon.png"))).toEqual([180, 180]);
  });
});
