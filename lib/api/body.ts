import { AppError } from "./errors";

/** Largest accepted request body, in bytes: 256 KiB. */
export const MAX_BODY_BYTES = 256 * 1024;

/**
 * Reads a JSON body, refusing non-JSON (415), bodies over `maxBytes` (413,
 * counted while reading, whatever Content-Length claims) and text that is not
 * JSON (400). Default limit MAX_BODY_BYTES.
 */
export async function readJsonBody(req: Request, maxBytes = MAX_BODY_BYTES): Promise<unknown> {
  const type = req.headers.get("content-type") ?? "";
  if (!/^application\/(?:[\w.+-]+\+)?json\s*(?:;|$)/i.test(type)) {
    throw new AppError("unsupported_media_type", "Send the body as JSON with `Content-Type: application/json`.", {
      contentType: type || null,
    });
  }
  const tooLarge = () =>
    new AppError("payload_too_large", `The body is larger than ${maxBytes} bytes; send less at once.`, { maxBytes });
  const declared = Number(req.headers.get("content-length") ?? NaN);
  if (Number.isFinite(declared) && declared > maxBytes) throw tooLarge();
  const chunks: Uint8Array[] = [];
  let total = 0;
  if (req.body) {
    const reader = req.body.getReader();
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      total += value.byteLength;
      if (total > maxBytes) {
        await reader.cancel().catch(() => {});
        throw tooLarge();
      }
      chunks.push(value);
    }
  }
  const bytes = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    bytes.set(c, at);
    at += c.byteLength;
  }
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    throw new AppError("malformed_json", "The body is not valid UTF-8 text.");
  }
  if (text.trim() === "") throw new AppError("malformed_json", "The body is empty; send a JSON object.");
  try {
    return JSON.parse(text);
  } catch (e) {
    throw new AppError("malformed_json", `The body is not valid JSON: ${(e as Error).message}`);
  }
}
