import { describe, expect, it } from "vitest";
import { COMMENT_MAX_LENGTH, excerpt, normalizeCommentText } from "./comment-text";
import { commentBody } from "./schemas";

describe("comment text", () => {
  it("keeps line breaks and turns CRLF and CR into LF", () => {
    expect(normalizeCommentText("Breathe here.\r\nThen lighter.\rAnd end.")).toBe("Breathe here.\nThen lighter.\nAnd end.");
  });

  it("keeps markup characters as typed, uninterpreted", () => {
    const typed = "**not bold** <b>not a tag</b> [link](x)";
    expect(normalizeCommentText(typed)).toBe(typed);
  });

  it("trims blank edges and trailing spaces, collapses long runs of blank lines", () => {
    expect(normalizeCommentText("\n\n  one  \n\n\n\n\n\ntwo\t\n\n")).toBe("one\n\n\ntwo");
  });

  it("drops control characters but keeps tabs inside a line", () => {
    expect(normalizeCommentText("a\u0000b\u0007c\td")).toBe("abc\td");
  });

  it("refuses an empty comment and one past the limit with a message", () => {
    const empty = commentBody.safeParse({ body: "  \n \r\n " });
    expect(empty.success).toBe(false);
    expect(empty.error?.issues[0].message).toMatch(/empty/);
    const long = commentBody.safeParse({ body: "x".repeat(COMMENT_MAX_LENGTH + 1) });
    expect(long.success).toBe(false);
    expect(long.error?.issues[0].message).toMatch(String(COMMENT_MAX_LENGTH));
    expect(commentBody.parse({ body: "x".repeat(COMMENT_MAX_LENGTH) }).body.length).toBe(COMMENT_MAX_LENGTH);
  });

  it("makes one-line excerpts", () => {
    expect(excerpt("a\nb   c")).toBe("a b c");
    expect(excerpt("abcdefghij", 5)).toBe("abcd…");
  });
});
