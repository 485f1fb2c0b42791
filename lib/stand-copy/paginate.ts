/**
 * Places blocks (header, systems, legend, table rows) top to bottom on pages of a fixed content
 * height. A block never straddles a page break: one that does not fit on what is left of the page
 * starts the next page; one taller than a whole page gets a page of its own and is scaled down by
 * the caller (`scale` < 1).
 */
export interface Block {
  height: number;
  /** Space kept free above the block unless it starts a page. */
  gapBefore?: number;
  /** Start a new page before this block (unless the current page is still empty). */
  breakBefore?: boolean;
}

export interface Placement {
  page: number;
  y: number;
  scale: number;
}

export function paginate(blocks: readonly Block[], pageHeight: number): Placement[] {
  if (!(pageHeight > 0)) throw new Error("page height must be positive");
  const out: Placement[] = [];
  let page = 0;
  let y = 0;
  for (const block of blocks) {
    const scale = block.height > pageHeight ? pageHeight / block.height : 1;
    const height = block.height * scale;
    let gap = y === 0 ? 0 : (block.gapBefore ?? 0);
    if (y > 0 && (block.breakBefore || y + gap + height > pageHeight)) {
      page += 1;
      y = 0;
      gap = 0;
    }
    out.push({ page, y: y + gap, scale });
    y += gap + height;
  }
  return out;
}
