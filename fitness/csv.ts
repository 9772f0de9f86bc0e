/**
 * A small RFC 4180 CSV reader: comma-separated (or another one-character separator), fields may be
 * quoted with "…" (a doubled quote inside stands for one) and may then hold separators and line
 * breaks. CRLF or LF line ends; a leading byte-order mark is ignored; blank lines are skipped.
 */
import { FitnessError } from './errors.ts';

export interface CsvRecord {
  /** 1-based line of the file where the record starts. */
  line: number;
  fields: string[];
}

export type Separator = ',' | ';' | '\t';

export const SEPARATOR_NAMES: Record<Separator, string> = {
  ',': 'comma',
  ';': 'semicolon',
  '\t': 'tab',
};

/**
 * The separator of a file, judged from its first line: the comma when it has one, else a
 * semicolon (spreadsheets set to a decimal-comma language write these) or a tab when it has one.
 */
export function detectSeparator(text: string): Separator {
  const first = text.replace(/^\ufeff/, '').split(/\r?\n/, 1)[0] ?? '';
  if (first.includes(',')) return ',';
  if (first.includes(';')) return ';';
  if (first.includes('\t')) return '\t';
  return ',';
}

export function parseCsv(text: string, separator: Separator = ','): CsvRecord[] {
  const records: CsvRecord[] = [];
  let i = text.charCodeAt(0) === 0xfeff ? 1 : 0;
  let line = 1;
  while (i < text.length) {
    const startLine = line;
    const fields: string[] = [];
    let field = '';
    let endOfRecord = false;
    while (!endOfRecord) {
      if (text[i] === '"') {
        i += 1;
        for (;;) {
          if (i >= text.length)
            throw new FitnessError(`line ${startLine}: a quoted field is never closed`);
          const c = text[i]!;
          if (c === '"') {
            if (text[i + 1] === '"') {
              field += '"';
              i += 2;
              continue;
            }
            i += 1;
            break;
          }
          if (c === '\n') line += 1;
          field += c;
          i += 1;
        }
        const next = text[i];
        if (next !== undefined && next !== separator && next !== '\n' && next !== '\r') {
          throw new FitnessError(`line ${line}: text after a closing quote`);
        }
      }
      while (i < text.length && text[i] !== separator && text[i] !== '\n' && text[i] !== '\r') {
        if (text[i] === '"')
          throw new FitnessError(`line ${line}: a quote inside an unquoted field`);
        field += text[i];
        i += 1;
      }
      fields.push(field);
      field = '';
      if (text[i] === separator) {
        i += 1;
      } else {
        if (text[i] === '\r') i += 1;
        if (text[i] === '\n') i += 1;
        line += 1;
        endOfRecord = true;
      }
    }
    if (!(fields.length === 1 && fields[0]!.trim() === ''))
      records.push({ line: startLine, fields });
  }
  return records;
}
