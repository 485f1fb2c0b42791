import type { IOSMDOptions } from "opensheetmusicdisplay";

/** How every Ondula page engraves a part: our own header and glyphs replace the engraver's. */
export const ENGRAVING_OPTIONS: IOSMDOptions = {
  backend: "svg",
  autoResize: false,
  drawTitle: false,
  drawSubtitle: false,
  drawComposer: false,
  drawLyricist: false,
  drawCredits: false,
  drawPartNames: false,
  drawMeasureNumbers: true,
  drawMeasureNumbersOnlyAtSystemStart: true,
};

/**
 * The engraving's own SVG inside a score stage (the stage also holds our overlay SVGs): the
 * engraver draws into the element marked `data-engraving`.
 */
export const ENGRAVING_SVG = "[data-engraving] svg";
