// The job health page's words (lib/alerts/scan-words.ts). Cron fields per the cron format
// (minute hour day-of-month month day-of-week; 0 and 7 are Sunday: crontab(5)); the result
// fields are those the expiry scan stores (jobs/definitions/expiry-scan.ts ExpiryScanResult).
import { describe, expect, it } from "vitest";
import { delayInWords, relativeTime, resultInWords, scheduleInWords } from "@/lib/alerts/scan-words";

describe("scheduleInWords", () => {
  it("says daily and weekly patterns in words and leaves others as they are", () => {
    expect(scheduleInWords("0 5 * * *")).toBe("Every day at 05:00");
    expect(scheduleInWords("30 6 * * 1")).toBe("Every Monday at 06:30");
    expect(scheduleInWords("0 7 * * 0")).toBe("Every Sunday at 07:00");
    expect(scheduleInWords("0 7 * * 7")).toBe("Every Sunday at 07:00");
    expect(scheduleInWords("*/15 * * * *")).toBe("Cron */15 * * * *");
    expect(scheduleInWords("0 5 1 * *")).toBe("Cron 0 5 1 * *");
  });
});

describe("resultInWords", () => {
  it("reads the scan's stored result", () => {
    expect(resultInWords({ status: "done", today: "2026-12-02", lotsChecked: 12, crossed: 3, created: 3 })).toBe("3 new alerts, 12 lots checked");
    expect(resultInWords({ status: "done", lotsChecked: 1, crossed: 1, created: 1 })).toBe("1 new alert, 1 lot checked");
    expect(resultInWords({ status: "done", lotsChecked: 0, crossed: 0, created: 0 })).toBe("No new alerts, 0 lots checked");
    expect(resultInWords({ status: "done", itemsChecked: 4, created: 2 })).toBe("2 new alerts, 4 items checked");
    expect(resultInWords({ status: "company-gone" })).toBe("The company was gone");
    expect(resultInWords({})).toBe("Finished");
    expect(resultInWords(null)).toBe("Finished");
  });
});

describe("relativeTime", () => {
  const now = Date.parse("2026-12-02T12:00:00Z");
  it("says how long ago or ahead, in whole units rounded down", () => {
    expect(relativeTime("2026-12-02T11:59:30Z", now)).toBe("just now");
    expect(relativeTime("2026-12-02T11:55:00Z", now)).toBe("5 minutes ago");
    expect(relativeTime("2026-12-02T11:59:00Z", now)).toBe("1 minute ago");
    expect(relativeTime("2026-12-02T09:10:00Z", now)).toBe("2 hours ago");
    expect(relativeTime("2026-11-29T12:00:00Z", now)).toBe("3 days ago");
    expect(relativeTime("2026-12-03T05:00:00Z", now)).toBe("in 17 hours");
    expect(relativeTime("2026-12-02T12:00:20Z", now)).toBe("in under a minute");
  });
});

describe("delayInWords", () => {
  it("names the cause", () => {
    expect(delayInWords({ reason: "queue-down" })).toBe("Alerts are delayed: the job queue is not answering");
    expect(delayInWords({ reason: "scan-late" })).toMatch(/^Alerts are delayed: the morning check/);
  });
});
