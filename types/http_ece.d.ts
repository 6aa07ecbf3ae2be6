declare module "http_ece" {
  interface EceParams {
    version?: "aes128gcm" | "aesgcm";
    privateKey?: import("node:crypto").ECDH;
    dh?: string;
    authSecret?: string;
    salt?: string;
    keyid?: string;
    rs?: number;
  }
  export function decrypt(buffer: Buffer, params: EceParams): Buffer;
  export function encrypt(buffer: Buffer, params: EceParams): Buffer;
}
