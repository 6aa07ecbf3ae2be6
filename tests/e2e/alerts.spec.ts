import AxeBuilder from "@axe-core/playwright";
import { expect, test, type Page } from "@playwright/test";
import { DEMO, openKestrelBend } from "./helpers";

/**
 * Alerts in Chromium: the manager's alerts appear in the in-app centre and open their field; a push
 * delivered to the page's service worker (through the DevTools protocol, since no real push service is
 * reachable here) becomes a notification carrying the field's address. Which URL a tap opens is unit
 * tested in tests/unit/alerts-service-worker.test.ts; Chromium offers no way to click a notification.
 */

interface NotificationsBody {
  data: { id: string; title: string; url: string; fieldId: string | null }[];
  unread: number;
}

/** Brings the demo's accounts up to date (the worker does) and evaluates the alert rules until some hold. */
async function alertsOf(page: Page, farmId: string): Promise<NotificationsBody> {
  await page.request.post(`/api/v1/farms/${farmId}/recompute`);
  let body: NotificationsBody = { data: [], unread: 0 };
  await expect
    .poll(
      async () => {
        body = (await (await page.request.get(`/api/v1/farms/${farmId}/notifications`)).json()) as NotificationsBody;
        const found = body.data.filter((n) => n.fieldId !== null).length;
        // The worker evaluates after its recompute; asking here too covers a demo whose accounts were already current.
        if (found === 0) await page.request.post(`/api/v1/farms/${farmId}/alerts/check`);
        return found;
      },
      { timeout: 120_000, intervals: [2_000] },
    )
    .toBeGreaterThan(0);
  return body;
}

test("the manager sees alerts in the centre, opens a field from one, and a pushed alert becomes a notification", async ({ page }, testInfo) => {
  test.setTimeout(240_000);
  const farmId = await openKestrelBend(page, DEMO.manager);
  const alerts = await alertsOf(page, farmId);
  const fieldAlert = alerts.data.find((n) => n.fieldId !== null)!;

  await page.goto(`/farms/${farmId}/alerts`);
  const list = page.getByTestId("alert-list");
  await expect(list.getByRole("link", { name: new RegExp(fieldAlert.title.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")) }).first()).toBeVisible();
  await expect(page.getByRole("link", { name: /Alerts, \d+ unread/ })).toBeVisible();
  await expect(page.getByText(/estimates/).first()).toBeVisible();
  await page.screenshot({ path: `tests/artifacts/screens/alerts-${testInfo.project.name}.png`, fullPage: true });
  const axe = await new AxeBuilder({ page }).analyze();
  expect(axe.violations.filter((v) => v.impact === "serious" || v.impact === "critical").map((v) => v.id)).toEqual([]);

  // A push as the service worker receives it: the notification carries the field's address.
  // Listen before enabling the domain: Chromium reports the registrations as soon as it is enabled.
  const cdp = await page.context().newCDPSession(page);
  const registrations: { registrationId: string; scopeURL: string }[] = [];
  cdp.on("ServiceWorker.workerRegistrationUpdated", (e: { registrations: { registrationId: string; scopeURL: string }[] }) => {
    registrations.push(...e.registrations);
  });
  const scope = await page.evaluate(async () => (await navigator.serviceWorker.ready).scope);
  await cdp.send("ServiceWorker.enable");
  await expect.poll(() => registrations.find((r) => r.scopeURL === scope)?.registrationId ?? null).not.toBeNull();
  const registrationId = registrations.find((r) => r.scopeURL === scope)!.registrationId;
  await page.context().grantPermissions(["notifications"]);
  const payload = { title: fieldAlert.title, body: "Delivered through DevTools", url: fieldAlert.url, tag: `rootbank-${fieldAlert.id}`, notificationId: fieldAlert.id, farmId };
  await cdp.send("ServiceWorker.deliverPushMessage", { origin: new URL(page.url()).origin, registrationId, data: JSON.stringify(payload) });
  await expect
    .poll(async () =>
      page.evaluate(async () => (await (await navigator.serviceWorker.ready).getNotifications()).map((n) => ({ title: n.title, url: (n.data as { url?: string }).url }))),
    )
    .toContainEqual({ title: fieldAlert.title, url: fieldAlert.url });

  // The centre's link opens the field the alert is about, and the alert counts as read.
  await list.getByRole("link").filter({ hasText: fieldAlert.title }).first().click();
  await page.waitForURL(new RegExp(`${fieldAlert.url}$`));
  const after = (await (await page.request.get(`/api/v1/farms/${farmId}/notifications`)).json()) as { data: { id: string; readAt: string | null }[] };
  expect(after.data.find((n) => n.id === fieldAlert.id)?.readAt).not.toBeNull();
});
