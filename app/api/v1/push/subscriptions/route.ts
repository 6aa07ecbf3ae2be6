import { devicesOf, subscribe, unsubscribe } from "@/db/push-subscriptions";
import { AppError } from "@/lib/api/errors";
import { created, readJson, withUser } from "@/lib/api/handler";
import { pushSubscriptionSchema, unsubscribeSchema } from "@/lib/validation/alerts";

// GET /api/v1/push/subscriptions — my devices that receive alerts by push
export const GET = withUser(async ({ user }) => ({ data: await devicesOf(user.id) }));

// POST /api/v1/push/subscriptions — subscribe this device (the browser's PushSubscription); again from the same device replaces its keys
export const POST = withUser(async ({ req, user }) => {
  const input = await readJson(req, pushSubscriptionSchema);
  const { device, created: isNew } = await subscribe(user.id, input);
  return isNew ? created(device) : device;
});

// DELETE /api/v1/push/subscriptions — unsubscribe a device of mine, named by its endpoint
export const DELETE = withUser(async ({ req, user }) => {
  const input = await readJson(req, unsubscribeSchema);
  if (!(await unsubscribe(user.id, { endpoint: input.endpoint }))) throw new AppError("not_found", "No such device among yours.");
  return undefined;
});
