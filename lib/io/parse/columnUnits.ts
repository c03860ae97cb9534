/**
 * Stage 4 of the importer, units: the unit of every used column, from its header, the unit
 * options, or the SI unit.
 */
import { DotspecError } from "../../util/errors.ts";
import { ACCEPTED_UNITS, SI_UNIT, findUnit, parseUnit, type Quantity, type UnitInfo } from "../units.ts";
import { describeColumn, type Column } from "./columns.ts";
import { quote } from "./messages.ts";

/**
 * Choose the unit of each used column.
 *
 * Parameters
 * ----------
 * columns : Column[]
 *     The columns of {@link nameColumns}; `unitInfo` and `unitFrom` are set in place, and a
 *     conductance column in volts gets the role `"other"`.
 * hasHeader : boolean
 *     Whether the file has a header (changes how defaulted columns are described).
 * units : Record<Quantity, UnitInfo | null>
 *     The parsed unit options (`biasUnit`, `currentUnit`, `conductanceUnit`), null where not given.
 * src : string
 *     Label of the text, put in front of error messages.
 * warnings : string[]
 *     Receives a warning for a unit read with another letter case, a unit option not used, a
 *     conductance column in volts ignored, and a header unit that is not a unit.
 *
 * Returns
 * -------
 * string[]
 *     The columns given the SI unit by default, described for one warning (see
 *     `warnColumnAssumptions`).
 *
 * Throws
 * ------
 * DotspecError
 *     `io/unknown-unit` for a header unit that is not a unit of the column's quantity (and no
 *     unit option to fall back on), listing the accepted units.
 *
 * Notes
 * -----
 * 1. A header unit of the column's quantity wins over the unit option.
 * 2. A conductance column whose unit is a bias unit (a lock-in signal in V) is ignored: it
 *    cannot be converted to siemens.
 * 3. A header unit that is no unit at all takes the unit option when one is given.
 * 4. Without a header unit: the unit option, else the SI unit (V, A, S), reported.
 *
 * References
 * ----------
 * SI prefixes: BIPM, The International System of Units, 9th ed. (2019), Table 7.
 *
 * Example
 * -------
 * ```ts
 * const cols = nameColumns({ cells: ["bias (mV)", "current"], line: 1 }, 2, resolveParseOptions({}), "(text)");
 * assignUnits(cols, true, { bias: null, current: null, conductance: null }, "(text)", []);  // => ["\"current\" as A"]
 * cols[0].unitInfo!.scale;  // => 0.001
 * ```
 */
export function assignUnits(
  columns: Column[],
  hasHeader: boolean,
  units: Record<Quantity, UnitInfo | null>,
  src: string,
  warnings: string[],
): string[] {
  const defaulted: string[] = [];
  for (const c of columns) {
    if (c.role === "other") continue;
    const q = c.role;
    const optionUnit = units[q];
    const optionName = `${q}Unit`;
    if (c.unitText !== null) {
      const u = findUnit(c.unitText, q);
      if (u) {
        c.unitInfo = u;
        c.unitFrom = "header";
        if (u.caseFolded) warnings.push(`unit ${quote(c.unitText)} of column ${describeColumn(c)} read as ${u.unit}`);
        if (optionUnit && optionUnit.exponent !== u.exponent) {
          warnings.push(`column ${describeColumn(c)} gives its unit (${u.unit}); option ${optionName} = ${optionUnit.unit} not used for it`);
        }
        continue;
      }
      const other = findUnit(c.unitText);
      if (q === "conductance" && other?.quantity === "bias") {
        c.role = "other";
        warnings.push(
          `column ${describeColumn(c)} is a conductance signal in ${other.unit}, which cannot be converted to siemens; ` +
            `ignored (dI/dV can be computed from the current)`,
        );
        continue;
      }
      if (!other && optionUnit) {
        c.unitInfo = optionUnit;
        c.unitFrom = "option";
        warnings.push(`column ${describeColumn(c)}: ${quote(c.unitText)} is not a unit; used ${optionName} = ${optionUnit.unit}`);
        continue;
      }
      throw new DotspecError(
        "io/unknown-unit",
        `${src}: column ${c.index} ${quote(c.header)} has unit ${quote(c.unitText)}, which is not a ${q} unit` +
          (other ? ` (it is a ${other.quantity} unit)` : "") +
          `; write one of ${ACCEPTED_UNITS[q].join(", ")} in the header, for example ${quote(`${c.name || q} (${SI_UNIT[q]})`)}` +
          (other ? "" : `, or pass the option ${optionName}`),
      );
    }
    if (optionUnit) {
      c.unitInfo = optionUnit;
      c.unitFrom = "option";
    } else {
      c.unitInfo = parseUnit(SI_UNIT[q], q);
      c.unitFrom = "default";
      defaulted.push(hasHeader ? `${quote(c.header)} as ${SI_UNIT[q]}` : `column ${c.index} (${q}) as ${SI_UNIT[q]}`);
    }
  }
  return defaulted;
}
