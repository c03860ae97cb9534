/**
 * The one error type dotspec throws on purpose.
 *
 * Every message names what was wrong, the value received and, where there is one, a fix:
 * `windowMV must be at least 3 bias steps (12 mV here); got 5`. `code` is a stable,
 * machine-readable tag (for example `"io/ragged-row"`), so callers can branch without parsing
 * the message.
 */
export class DotspecError extends Error {
  override readonly name = "DotspecError";
  readonly code: string;

  constructor(code: string, message: string) {
    super(message);
    this.code = code;
  }
}

/** True when `err` is a {@link DotspecError}, also across module copies (workers, bundles). */
export function isDotspecError(err: unknown): err is DotspecError {
  return err instanceof DotspecError || (err instanceof Error && err.name === "DotspecError" && "code" in err);
}
