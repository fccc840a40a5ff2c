/** Where a delimited file's bytes may be cut into pieces of whole lines, each read on its own. */
export interface LineChunks {
  /** Bytes of the header line, its line end included. */
  readonly headerEnd: number;
  /** Piece i is bytes cuts[i]..cuts[i + 1]; cuts[0] = headerEnd and the last cut is the file's length. */
  readonly cuts: number[];
}

const LF = 10;
const QUOTE = 34;

/**
 * Cuts a CSV file (header line, then rows) into up to `parts` pieces of about equal size, each ending after a line
 * feed, so that every piece can be read alone with the header in front of it. It refuses (null) when a cut could
 * fall inside a field: a file with any double quote (a quoted field may hold a line break) is never cut; and when
 * there would be fewer than two pieces of at least `minBytes`. Cost: one search for a quote (memchr speed) and
 * a short scan per cut.
 * @param parts pieces wanted (>= 2 to cut at all); minBytes the smallest piece worth a worker.
 * @example lineChunks(Buffer.from('x\n1\n2\n3\n4\n'), 2, 1) // { headerEnd: 2, cuts: [2, 6, 10] }: '1\n2\n' and '3\n4\n'
 */
export function lineChunks(bytes: Uint8Array, parts: number, minBytes: number): LineChunks | null {
  if (parts < 2) return null;
  const n = bytes.length;
  if (bytes.indexOf(QUOTE) >= 0) return null;
  const first = bytes.indexOf(LF);
  if (first < 0) return null;
  const headerEnd = first + 1;
  const body = n - headerEnd;
  const count = Math.min(parts, Math.floor(body / Math.max(1, minBytes)));
  if (count < 2) return null;
  const cuts = [headerEnd];
  for (let i = 1; i < count; i++) {
    const want = headerEnd + Math.floor((body * i) / count);
    // The line end at or after the byte before `want`: a cut at `want` itself when a line starts there.
    const lf = bytes.indexOf(LF, Math.max(want - 1, cuts[cuts.length - 1]));
    if (lf < 0 || lf + 1 >= n) break;
    if (lf + 1 > cuts[cuts.length - 1]) cuts.push(lf + 1);
  }
  cuts.push(n);
  return cuts.length >= 3 ? { headerEnd, cuts } : null;
}
