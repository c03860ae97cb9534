// Library option names turned into the CLI's in printed messages. The table is locked here (derived by construction from the commands' declarations); the
// flags are those declared by the commands (checked against `--help` in test/robustness).
import { describe, expect, it } from "vitest";
import { cliOptionNames, CLI_OPTION_NAMES } from "../../lib/cli/cliOptionNames.ts";
import { batchCount } from "../../lib/cli/batchCount.ts";

describe("cliOptionNames(message)", () => {
  it("CLI_OPTION_NAMES is frozen and holds these names (locked)", () => {
    expect(Object.isFrozen(CLI_OPTION_NAMES)).toBe(true);
    expect({ ...CLI_OPTION_NAMES }).toEqual({
      biasUnit: "--bias-unit",
      currentUnit: "--current-unit",
      biasPolarity: "--bias-polarity",
      windowMV: "--window-mv",
      minStepSigma: "--min-step-sigma",
      useMeasured: "--use-measured",
      binNM: "--bin-nm",
    });
  });

  it("replaces whole words only, and leaves keys after a dot or a dash alone", () => {
    expect(cliOptionNames("windowMV must be at least 3 bias steps")).toBe("--window-mv must be at least 3 bias steps");
    expect(cliOptionNames("windowMVs")).toBe("windowMVs");
    expect(cliOptionNames("scenario.windowMV")).toBe("scenario.windowMV");
    expect(cliOptionNames("--current-unit")).toBe("--current-unit");
    expect(cliOptionNames("theta must be")).toBe("theta must be");
  });
});

describe("batchCount(done, failed, warnings, warnedFiles)", () => {
  it("one line with the three counts (singular and plural as English has them)", () => {
    expect(batchCount(5, 1, 3, 2)).toBe("dotspec: 5 done, 1 failed, 3 warnings (in 2 files)\n");
    expect(batchCount(1, 0, 1, 1)).toBe("dotspec: 1 done, 0 failed, 1 warning (in 1 file)\n");
    expect(batchCount(0, 0, 0, 0)).toBe("dotspec: 0 done, 0 failed, 0 warnings\n");
  });
});
