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

/**
 * True when `err` is a {@link DotspecError}, also across module copies (workers, bundles).
 *
 * Parameters
 * ----------
 * err : unknown
 *     Anything caught.
 *
 * Returns
 * -------
 * boolean
 *     True for a DotspecError (recognised by its name and a string `code`, so that errors from
 *     another copy of the module count too).
 *
 * Example
 * -------
 * ```ts
 * isDotspecError(new DotspecError("io/bad-path", "no such file")); // => true
 * isDotspecError(new Error("x")); // => false
 * ```
 */
export function isDotspecError(err: unknown): err is DotspecError {
  return err instanceof DotspecError || (err instanceof Error && err.name === "DotspecError" && "code" in err);
}

/**
 * The one-line reason of a failure on one input, as `dotspec` prints it after `dotspec: FILE: `
 * and the notebooks show it after the file's name.
 *
 * Parameters
 * ----------
 * source : string
 *     The file (or label) the failure is about; a message that already starts with `source: ` has
 *     that prefix removed, so the name is not repeated.
 * err : unknown
 *     What was thrown.
 *
 * Returns
 * -------
 * string
 *     The message of a {@link DotspecError}; for anything else (a bug, not bad input)
 *     `internal error (Name: message); please report it with the file`.
 *
 * Example
 * -------
 * ```ts
 * failureReason("a.csv", new DotspecError("io/binary", "a.csv: the file holds NUL bytes, …"));
 * // => "the file holds NUL bytes, …"
 * ```
 */
export function failureReason(source: string, err: unknown): string {
  if (isDotspecError(err)) {
    const prefix = `${source}: `;
    return err.message.startsWith(prefix) ? err.message.slice(prefix.length) : err.message;
  }
  const e = err instanceof Error ? err : new Error(String(err));
  return `internal error (${e.name}: ${e.message}); please report it with the file`;
}
