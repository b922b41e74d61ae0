// CSV as RFC 4180 writes it: fields separated by commas, records ended by CRLF, a field quoted when it holds a comma,
// a double quote, CR or LF, with its double quotes doubled. A text cell that a spreadsheet would read as a formula
// (it starts with =, +, -, @, a tab or a CR) gets a leading apostrophe first, the common practice against formula
// injection: a job name typed as `=HYPERLINK(…)` must arrive as text. Numbers and booleans are written as they are.

export type CsvValue = string | number | boolean | null;

const FORMULA_START = /^[=+\-@\t\r]/;
const NEEDS_QUOTES = /[",\r\n]/;

/** One field: null is empty, text is neutralised and quoted as needed. */
export function csvField(value: CsvValue): string {
  if (value === null) return "";
  if (typeof value === "number") return Number.isFinite(value) ? String(value) : "";
  if (typeof value === "boolean") return value ? "true" : "false";
  const text = FORMULA_START.test(value) ? `'${value}` : value;
  return NEEDS_QUOTES.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

/** One record, with its CRLF. */
export function csvRecord(values: readonly CsvValue[]): string {
  return `${values.map(csvField).join(",")}\r\n`;
}

/** Reads CSV back into records of fields (RFC 4180; the apostrophe a formula got is kept): for tests and checks. */
export function parseCsv(text: string): string[][] {
  const records: string[][] = [];
  let record: string[] = [];
  let field = "";
  let quoted = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (quoted) {
      if (c === '"' && text[i + 1] === '"') {
        field += '"';
        i++;
      } else if (c === '"') quoted = false;
      else field += c;
    } else if (c === '"') quoted = true;
    else if (c === ",") {
      record.push(field);
      field = "";
    } else if (c === "\r" && text[i + 1] === "\n") {
      record.push(field);
      records.push(record);
      record = [];
      field = "";
      i++;
    } else field += c;
  }
  if (field !== "" || record.length > 0) records.push([...record, field]);
  return records;
}
