/**
 * A certificate for the local fakes that speak HTTPS (the push service must: senders only use TLS).
 * Generated once into .data/local-tls/; `npm start` and `npm test` hand it to every process they start
 * through NODE_EXTRA_CA_CERTS, so the real clients trust it without any change to their code.
 */
import { existsSync, mkdirSync, readFileSync, writeFileSync } from "node:fs";
import path from "node:path";
import { generate } from "selfsigned";

export const LOCAL_TLS_DIR = path.resolve(".data", "local-tls");
export const LOCAL_CERT = path.join(LOCAL_TLS_DIR, "cert.pem");
const LOCAL_KEY = path.join(LOCAL_TLS_DIR, "key.pem");

export async function ensureLocalCert(): Promise<string> {
  if (existsSync(LOCAL_CERT) && existsSync(LOCAL_KEY)) return LOCAL_CERT;
  mkdirSync(LOCAL_TLS_DIR, { recursive: true });
  const now = new Date();
  const pems = await generate([{ name: "commonName", value: "Rootbank local services" }], {
    keyType: "ec",
    curve: "P-256",
    algorithm: "sha256",
    notBeforeDate: now,
    notAfterDate: new Date(now.getTime() + 10 * 365 * 24 * 3600 * 1000),
    extensions: [
      { name: "basicConstraints", cA: true },
      { name: "subjectAltName", altNames: [{ type: 7, ip: "127.0.0.1" }, { type: 2, value: "localhost" }] },
    ],
  });
  writeFileSync(LOCAL_KEY, pems.private, { mode: 0o600 });
  writeFileSync(LOCAL_CERT, pems.cert);
  return LOCAL_CERT;
}

/**
 * The file to give as NODE_EXTRA_CA_CERTS: the local certificate, plus whatever file the environment
 * already named there (Node reads only one), so nothing the machine trusted is lost.
 */
export function extraCaFile(localCert: string, existing: string | undefined): string {
  if (!existing || path.resolve(existing) === localCert || !existsSync(existing)) return localCert;
  const bundle = path.join(LOCAL_TLS_DIR, "extra-ca-bundle.pem");
  writeFileSync(bundle, `${readFileSync(existing, "utf8").trimEnd()}\n${readFileSync(localCert, "utf8")}`);
  return bundle;
}

export function localTls(): { key: Buffer; cert: Buffer } {
  return { key: readFileSync(LOCAL_KEY), cert: readFileSync(LOCAL_CERT) };
}
