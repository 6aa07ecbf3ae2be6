import "server-only";
import { AppError } from "@/lib/api/errors";

/** Gauge photos: a phone photo is 2-6 MB; 10 MB leaves room for HEIC at full resolution. */
export const MAX_PHOTO_BYTES = 10 * 1024 * 1024;

export const PHOTO_TYPES = { "image/jpeg": "jpg", "image/png": "png", "image/webp": "webp", "image/heic": "heic" } as const;
export type PhotoType = keyof typeof PHOTO_TYPES;

function ascii(bytes: Uint8Array, from: number, to: number): string {
  return String.fromCharCode(...bytes.subarray(from, to));
}

/**
 * The image type from the file's first bytes. The browser's claimed type is not trusted: the photo is
 * served back to other members with the type stored here.
 */
export function sniffPhotoType(bytes: Uint8Array): PhotoType | undefined {
  if (bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff) return "image/jpeg";
  if (ascii(bytes, 0, 8) === "\x89PNG\r\n\x1a\n") return "image/png";
  if (ascii(bytes, 0, 4) === "RIFF" && ascii(bytes, 8, 12) === "WEBP") return "image/webp";
  if (ascii(bytes, 4, 8) === "ftyp" && ["heic", "heix", "heim", "heis", "mif1", "msf1"].includes(ascii(bytes, 8, 12))) {
    return "image/heic";
  }
  return undefined;
}

/** Checks an uploaded photo's size and type; answers 413 or 422 naming the `photo` field. */
export async function readPhoto(file: File): Promise<{ data: Uint8Array; type: PhotoType; extension: string }> {
  if (file.size > MAX_PHOTO_BYTES) {
    throw new AppError("payload_too_large", "The photo is larger than 10 MB. Send a smaller or more compressed photo.", {
      photo: "At most 10 MB",
    });
  }
  const data = new Uint8Array(await file.arrayBuffer());
  const type = sniffPhotoType(data);
  if (!type) throw new AppError("invalid", "The photo must be a JPEG, PNG, WebP or HEIC image.", { photo: "Not a JPEG, PNG, WebP or HEIC image" });
  return { data, type, extension: PHOTO_TYPES[type] };
}
