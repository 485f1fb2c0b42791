import { describe, expect, it } from "vitest";
import { TOKEN_TTL_MS } from "@/lib/auth/tokens";
import { appLink, signInLinkMail, studioInviteMail, verifyEmailMail } from "./templates";

describe("mail templates", () => {
  it("builds links from APP_URL with the token encoded", () => {
    expect(appLink("http://127.0.0.1:3100", "/verify-email", { token: "a+b/c" })).toBe("http://127.0.0.1:3100/verify-email?token=a%2Bb%2Fc");
  });

  it("puts the link in both bodies and escapes names in the HTML one", () => {
    const url = "http://app.test/studio/join?token=abc";
    const mail = studioInviteMail({ teacherName: "<b>Teo</b>", studioName: "Teo's studio", url });
    expect(mail.text).toContain(url);
    expect(mail.html).toContain(`href="${url}"`);
    expect(mail.html).toContain("&lt;b&gt;Teo&lt;/b&gt;");
    expect(mail.html).not.toContain("<b>Teo</b>");
    expect(verifyEmailMail({ name: "Ines", url }).text).toMatch(/48 hours/);
  });

  it("says how long a sign-in link works and that it works once", () => {
    const url = "http://app.test/sign-in/link?token=abc";
    const mail = signInLinkMail({ name: "Ines", url });
    expect(mail.text).toContain(url);
    // The mail must state the lifetime the token really has.
    expect(mail.text).toContain(`once and for ${TOKEN_TTL_MS.sign_in_link / 60_000} minutes`);
    expect(mail.html).toContain(`href="${url}"`);
  });
});
