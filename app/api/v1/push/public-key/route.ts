import { withErrors } from "@/lib/api/handler";
import { vapidKeys } from "@/lib/alerts/vapid";

// GET /api/v1/push/public-key — the server's VAPID public key, for PushManager.subscribe's applicationServerKey
export const GET = withErrors(async () => ({ publicKey: (await vapidKeys()).publicKey }));
