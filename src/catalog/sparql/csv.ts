/**
 * SPARQL 1.1 Query Results CSV, read as a stream
 * ==============================================
 *
 * SPARQL 1.1 Query Results CSV and TSV Formats (W3C Recommendation 2013, §2): a header record
 * naming the projected variables, then one record per solution, each a comma-separated
 * record of RFC 4180 ("Common Format and MIME Type for CSV Files", §2): a field holding a
 * comma, a double quote or a line break is enclosed in double quotes, a double quote inside
 * it doubled; records end with CRLF (a store may send LF alone, which is read the same way).
 * The format writes every term as its plain text — an IRI without angle brackets, a literal
 * as its lexical form, no language tag or datatype — so a query read this way projects what
 * it needs to tell terms apart (`isBlank`, `lang`, `datatype`) as columns of its own.
 *
 * {@link CsvRecords} is a push parser: text is fed in the chunks the connection delivers, and
 * every complete record is handed on as soon as its line ends, so a large answer is never
 * held whole (neither its text nor its rows). A field may span chunks, and so may a quoted
 * field with line breaks. `end()` says whether the text stopped inside a record.
 */

/** A parser of RFC 4180 records, fed text in chunks. */
export class CsvRecords {
  private fields: string[] = [];
  private field = "";
  /** Inside a quoted field. */
  private quoted = false;
  /** The last character of the previous chunk was a `"` inside a quoted field (a doubled quote or the closing one). */
  private quotePending = false;
  /** Characters seen in the current record (an empty line is no record). */
  private started = false;
  private afterCr = false;
  records = 0;

  constructor(private readonly onRecord: (fields: string[]) => void) {}

  /** Reads the next chunk of text. */
  feed(text: string): void {
    let i = 0;
    const n = text.length;
    if (this.quotePending) {
      this.quotePending = false;
      if (n > 0 && text.charCodeAt(0) === 34) {
        this.field += '"';
        i = 1;
      } else this.quoted = false;
    }
    while (i < n) {
      if (this.quoted) {
        const q = text.indexOf('"', i);
        if (q < 0) {
          this.field += text.slice(i);
          return;
        }
        this.field += text.slice(i, q);
        if (q + 1 >= n) {
          this.quotePending = true;
          return;
        }
        if (text.charCodeAt(q + 1) === 34) {
          this.field += '"';
          i = q + 2;
        } else {
          this.quoted = false;
          i = q + 1;
        }
        continue;
      }
      const c = text.charCodeAt(i);
      if (c === 44) {
        // ,
        this.fields.push(this.field);
        this.field = "";
        this.started = true;
        this.afterCr = false;
        i++;
      } else if (c === 10 || c === 13) {
        // a record ends at LF, at CR, and at CRLF (the LF after a CR ends nothing more)
        if (!(c === 10 && this.afterCr)) this.endRecord();
        this.afterCr = c === 13;
        i++;
      } else if (c === 34 && this.field === "") {
        this.quoted = true;
        this.started = true;
        this.afterCr = false;
        i++;
      } else {
        // a run of plain characters up to the next comma, quote or line end
        let j = i + 1;
        while (j < n) {
          const d = text.charCodeAt(j);
          if (d === 44 || d === 10 || d === 13 || d === 34) break;
          j++;
        }
        this.field += text.slice(i, j);
        this.started = true;
        this.afterCr = false;
        i = j;
      }
    }
  }

  private endRecord(): void {
    if (!this.started) return;
    this.fields.push(this.field);
    const f = this.fields;
    this.fields = [];
    this.field = "";
    this.started = false;
    this.records++;
    this.onRecord(f);
  }

  /** The end of the text: false when it stopped inside a quoted field. A last record without its line end is handed on. */
  end(): boolean {
    if (this.quotePending) {
      this.quotePending = false;
      this.quoted = false;
    }
    if (this.quoted) return false;
    this.endRecord();
    return true;
  }
}
