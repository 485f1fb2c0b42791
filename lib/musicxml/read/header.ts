/** Part of step 2: the score's header — title, composer, and the part list's ids, order and names. */
export class HeaderReader {
  title = "";
  movementTitle = "";
  composer = "";
  readonly partNames = new Map<string, string>();
  readonly partListOrder: string[] = [];
  private creatorType = "";
  private scorePartId = "";

  open(name: string, attrs: Record<string, string>, depth: number): void {
    if (name === "score-part") {
      this.scorePartId = attrs.id ?? "";
      if (depth === 3 && !this.partListOrder.includes(this.scorePartId)) this.partListOrder.push(this.scorePartId);
    } else if (name === "creator") {
      this.creatorType = attrs.type ?? "";
    }
  }

  close(name: string, text: string, parent: string): void {
    switch (name) {
      case "part-name":
        if (parent === "score-part") this.partNames.set(this.scorePartId, text.trim());
        return;
      case "work-title":
        this.title = text.trim();
        return;
      case "movement-title":
        this.movementTitle = text.trim();
        return;
      case "creator":
        if (this.creatorType === "composer" && !this.composer) this.composer = text.trim();
        return;
    }
  }
}
