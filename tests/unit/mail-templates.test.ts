import { describe, expect, it } from "vitest";
import { formatDateTime, invitationEmail, passwordResetEmail } from "../../lib/mail/templates";

// 03:30 UTC on 1 July 2026: already the 1st in London, still the 30th of June in Chicago.
const EXPIRES = new Date("2026-07-01T03:30:00Z");

describe("formatDateTime", () => {
  it("shows the instant in the reader's time zone", () => {
    // outside fact: in July London is on BST (UTC+1) and Chicago on CDT (UTC-5)
    expect(formatDateTime(EXPIRES, "Europe/London")).toContain("1 Jul 2026, 04:30");
    expect(formatDateTime(EXPIRES, "America/Chicago")).toContain("30 Jun 2026, 22:30");
  });
});

describe("invitationEmail", () => {
  const base = {
    name: "Ana", companyName: "Quill & Sons", inviterName: "Marit", role: "kitchen_lead" as const,
    link: "https://app.example.test/invitation/tok123", expiresAt: EXPIRES,
  };

  it("shows the expiry in the reader's time zone and contains the link", () => {
    const london = invitationEmail({ ...base, timeZone: "Europe/London" });
    const chicago = invitationEmail({ ...base, timeZone: "America/Chicago" });
    expect(london.text).toContain("1 Jul 2026, 04:30"); // BST, UTC+1
    expect(chicago.text).toContain("30 Jun 2026, 22:30"); // CDT, UTC-5
    expect(chicago.text).not.toContain("04:30");
    for (const m of [london, chicago]) {
      expect(m.text).toContain(base.link);
      expect(m.html).toContain(`href="${base.link}"`);
      expect(m.text).toContain("kitchen lead");
    }
    expect(london.subject).toBe("You're invited to Quill & Sons on Hank & Lot");
  });

  it("escapes HTML in every value", () => {
    const m = invitationEmail({
      ...base, name: `<script>alert("x")</script>`, companyName: `Tom's "Best" <b>`, inviterName: "A & B",
      link: `https://app.example.test/invitation/a"b&c`, timeZone: "UTC",
    });
    expect(m.html).not.toContain("<script>");
    expect(m.html).not.toContain("<b>");
    expect(m.html).toContain("&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt;");
    expect(m.html).toContain("Tom&#39;s &quot;Best&quot; &lt;b&gt;");
    expect(m.html).toContain("A &amp; B");
    expect(m.html).toContain(`href="https://app.example.test/invitation/a&quot;b&amp;c"`);
    // the plain text part is not HTML and stays as typed
    expect(m.text).toContain(`<script>alert("x")</script>`);
  });
});

describe("passwordResetEmail", () => {
  const base = { name: "Ana", link: "https://app.example.test/reset-password/tok456", expiresAt: EXPIRES };

  it("shows the expiry in the reader's time zone and contains the link", () => {
    const london = passwordResetEmail({ ...base, timeZone: "Europe/London" });
    const chicago = passwordResetEmail({ ...base, timeZone: "America/Chicago" });
    expect(london.text).toContain("1 Jul 2026, 04:30"); // BST, UTC+1
    expect(chicago.text).toContain("30 Jun 2026, 22:30"); // CDT, UTC-5
    for (const m of [london, chicago]) {
      expect(m.text).toContain(base.link);
      expect(m.html).toContain(`href="${base.link}"`);
    }
  });

  it("escapes HTML", () => {
    const m = passwordResetEmail({ ...base, name: "<i>Ana</i> & co", timeZone: "UTC" });
    expect(m.html).not.toContain("<i>");
    expect(m.html).toContain("&lt;i&gt;Ana&lt;/i&gt; &amp; co");
  });
});
