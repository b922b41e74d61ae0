/**
 * A small reader of comma-separated values as RFC 4180 defines them: fields separated by commas, records by
 * CRLF (LF and CR alone are accepted too), a field in double quotes may hold commas, line breaks and doubled
 * quotes (""). No npm package for CSV is among the project's dependencies, and this is all a catalogue needs.
 *
 * Each record carries the line it starts on (1-based), so a refusal can name the row a spreadsheet shows.
 */
export interface CsvRecord {
  line: number;
  fields: string[];
}

export type CsvResult = { ok: true; records: CsvRecord[] } | { ok: false; line: number; message: string };

export function parseCsv(text: string): CsvResult {
  const records: CsvRecord[] = [];
  let fields: string[] = [];
  let field = "";
  let line = 1;
  let recordLine = 1;
  let i = text.charCodeAt(0) === 0xfeff ? 1 : 0; // a byte-order mark is not part of the first header
  let quoted = false; // inside a quoted field
  let wasQuoted = false; // the current field was quoted (only a separator or record end may follow)

  const endField = () => {
    fields.push(field);
    field = "";
    wasQuoted = false;
  };
  const endRecord = () => {
    endField();
    // A blank line (one empty, unquoted field) is not a record.
    if (!(fields.length === 1 && fields[0] === "")) records.push({ line: recordLine, fields });
    fields = [];
  };

  for (; i < text.length; i++) {
    const ch = text[i];
    if (quoted) {
      if (ch === '"') {
        if (text[i + 1] === '"') {
          field += '"';
          i++;
        } else {
          quoted = false;
          wasQuoted = true;
        }
      } else {
        if (ch === "\n") line++;
        field += ch;
      }
      continue;
    }
    if (ch === ",") endField();
    else if (ch === "\r" || ch === "\n") {
      if (ch === "\r" && text[i + 1] === "\n") i++;
      endRecord();
      line++;
      recordLine = line;
    } else if (wasQuoted) {
      return { ok: false, line, message: `Line ${line}: after a closing quote only a comma or the end of the line may follow.` };
    } else if (ch === '"') {
      if (field !== "") {
        return {
          ok: false,
          line,
          message: `Line ${line}: a quote inside an unquoted field; put the whole field in quotes and double the quote ("").`,
        };
      }
      quoted = true;
    } else field += ch;
  }
  if (quoted) return { ok: false, line: recordLine, message: `Line ${recordLine}: a quoted field is never closed.` };
  if (field !== "" || fields.length > 0 || wasQuoted) endRecord();
  return { ok: true, records };
}
