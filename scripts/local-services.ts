/**
 * Local stand-ins for the hosted services Rootbank talks to, started by `npm start` and `npm test`:
 * the e-mail inbox (SMTP) and the weather forecast service (HTTP, read through FORECAST_API_URL). Each
 * speaks the real protocol, so the app's code is the production code.
 */
import path from "node:path";
import { startForecastFake } from "./fakes/forecast";
import { startInbox } from "./fakes/inbox";
import { startPushService } from "./fakes/push";
import { ensureLocalCert, localTls } from "./fakes/tls";

const smtpPort = Number(process.env.LOCAL_INBOX_SMTP_PORT ?? 2525);
const httpPort = Number(process.env.LOCAL_INBOX_HTTP_PORT ?? 2580);
const inbox = startInbox({ smtpPort, httpPort, dir: path.resolve(".data", `inbox-${smtpPort}`) });
console.log(`e-mail inbox: SMTP on 127.0.0.1:${smtpPort}, messages at http://127.0.0.1:${httpPort}/messages`);

const forecastPort = Number(process.env.FAKE_FORECAST_PORT ?? 2590);
const forecast = startForecastFake({ port: forecastPort });
void forecast.then(({ url }) => console.log(`forecast service: ${url}/v1/forecast`));

// Web Push (RFC 8030) for alerts; its certificate is trusted by the app through NODE_EXTRA_CA_CERTS.
const pushPort = Number(process.env.FAKE_PUSH_PORT ?? 2595);
const push = ensureLocalCert().then(() => startPushService(pushPort, localTls()));
void push.then(() => console.log(`push service: https://127.0.0.1:${pushPort}/devices`));

function stop() {
  inbox.smtp.close(() => undefined);
  inbox.http.close();
  void forecast.then(({ server }) => server.close());
  void push.then((server) => server.close());
  process.exit(0);
}
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
