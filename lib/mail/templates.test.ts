import { describe, expect, it } from "vitest";
import { appLink, studioInviteMail, verifyEmailMail } from "./templates";

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
});
