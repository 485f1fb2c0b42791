/**
 * jsPDF's built-in fonts (Helvetica, Times) encode text as WinAnsi (Windows-1252): characters
 * outside it print as garbage. Music signs become their plain-text spellings; anything else not
 * in the code page becomes "?".
 */
const SPELLED: Record<string, string> = { "♯": "#", "♭": "b", "♮": "nat.", "𝄪": "x", "𝄫": "bb", "♩": "quarter", "♪": "eighth", "≈": "~", "−": "-" };

/** The 27 characters of Windows-1252 at 0x80–0x9F (the rest of 0xA0–0xFF equals Latin-1). */
const CP1252_EXTRA = new Set("€‚ƒ„…†‡ˆ‰Š‹ŒŽ‘’“”•–—˜™š›œžŸ");

export function winAnsi(text: string): string {
  let out = "";
  for (const ch of text.normalize("NFC")) {
    if (SPELLED[ch] !== undefined) out += SPELLED[ch];
    else {
      const code = ch.codePointAt(0)!;
      if (code === 0x0a || code === 0x09) out += " ";
      else if ((code >= 0x20 && code < 0x7f) || (code >= 0xa0 && code <= 0xff) || CP1252_EXTRA.has(ch)) out += ch;
      else out += "?";
    }
  }
  return out;
}
