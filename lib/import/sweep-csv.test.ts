import { describe, expect, it } from "vitest";
import { checkSweepReadings, describeLayoutProblem, detectSweepCsvLayout, readDecimal, readSweepCsv, SweepRowReader, type suggestMapping } from "./sweep-csv";

function readAll(text: string, mapping?: Partial<ReturnType<typeof suggestMapping>>) {
  const layout = detectSweepCsvLayout(text);
  return { layout, result: readSweepCsv(text, layout, { ...layout.suggested, ...mapping }) };
}

describe("detectSweepCsvLayout", () => {
  it("finds a comma delimiter and a header, and reads units from the header", () => {
    const text = "Freq (kHz),Vout (mV)\n100,250\n110,240\n120,230\n";
    const layout = detectSweepCsvLayout(text);
    expect(layout).toMatchObject({ delimiter: ",", hasHeader: true, decimalComma: false, columns: ["Freq (kHz)", "Vout (mV)"] });
    expect(layout.suggested).toEqual({ frequencyColumn: 0, frequencyUnit: "kHz", amplitudeColumn: 1, amplitudeUnit: "mV" });
    expect(layout.sampleRows[0]).toEqual(["100", "250"]);
  });

  it("finds a semicolon delimiter with decimal commas", () => {
    const layout = detectSweepCsvLayout("Frequenz [Hz];Amplitude [V]\n1000,5;0,25\n1001,5;0,26\n1002,5;0,27\n");
    expect(layout.delimiter).toBe(";");
    expect(layout.decimalComma).toBe(true);
    expect(layout.hasHeader).toBe(true);
  });

  it("finds a tab delimiter without a header", () => {
    const layout = detectSweepCsvLayout("100000\t1.5\n101000\t1.6\n102000\t1.7\n");
    expect(layout).toMatchObject({ delimiter: "\t", hasHeader: false, columns: ["Column 1", "Column 2"] });
    expect(layout.suggested).toMatchObject({ frequencyColumn: 0, amplitudeColumn: 1, frequencyUnit: "Hz", amplitudeUnit: "V" });
  });

  it("ignores a byte-order mark and blank lines, and finds the columns among others", () => {
    const layout = detectSweepCsvLayout("\uFEFFIndex,Time (s),Frequency (MHz),CH1 Amplitude (V)\n\n1,0.1,0.2,1.0\n2,0.2,0.21,1.1\n3,0.3,0.22,1.2\n");
    expect(layout.columns[0]).toBe("Index");
    expect(layout.suggested).toMatchObject({ frequencyColumn: 2, frequencyUnit: "MHz", amplitudeColumn: 3, amplitudeUnit: "V" });
  });

  it("keeps a quoted header that contains the delimiter in one column", () => {
    const layout = detectSweepCsvLayout('"Freq, kHz","Ch 1, V"\n1,2\n3,4\n5,6\n');
    expect(layout.columns).toEqual(["Freq, kHz", "Ch 1, V"]);
  });
});

describe("readSweepCsv", () => {
  it("reads every row into SI with its file row number", () => {
    const { result } = readAll("Freq (kHz),Vout (mV)\n100,250\n\n110,240\n120,230\n");
    expect(result).toEqual({
      ok: true,
      points: [
        { row: 2, frequencyHz: 100e3, amplitudeV: 0.25 },
        { row: 4, frequencyHz: 110e3, amplitudeV: 0.24 },
        { row: 5, frequencyHz: 120e3, amplitudeV: 0.23 },
      ],
    });
  });

  it("reads decimal commas and exponents", () => {
    const { result } = readAll("f;v\n1,5e5;0,5\n1,6e5;0,6\n");
    // "1,5e5" is not a decimal-comma number: refused with its row and column.
    expect(result.ok).toBe(false);
    const ok = readAll("f;v\n150000;0,5\n160000;0,6\n1.7e5;0,7\n").result;
    expect(ok.ok && ok.points.map((p) => [p.frequencyHz, p.amplitudeV])).toEqual([
      [150000, 0.5],
      [160000, 0.6],
      [170000, 0.7],
    ]);
  });

  it("refuses a bad number with the row, the column and what was expected", () => {
    const rows = ["Freq (kHz),Vout (V)", ...Array.from({ length: 12 }, (_, i) => `${100 + i},1.${i}`), "3.2.1,1.5"];
    const { result } = readAll(rows.join("\n"));
    expect(result).toEqual({
      ok: false,
      error: expect.objectContaining({ row: 14, column: "Freq (kHz)", message: "Row 14, column 'Freq (kHz)': expected a number, got '3.2.1'" }),
    });
  });

  it("refuses a short row, a zero frequency and a negative reading", () => {
    expect(readAll("f,v\n1,2\n3\n4,5\n").result).toMatchObject({ ok: false, error: { row: 3, column: "", message: "Row 3: expected at least 2 columns, got '3'" } });
    expect(readAll("f,v\n1,2\n0,2\n4,5\n").result).toMatchObject({ ok: false, error: { row: 3, column: "f", expected: "a frequency above 0" } });
    expect(readAll("f,v\n1,2\n2,-1\n4,5\n").result).toMatchObject({ ok: false, error: { row: 3, column: "v", expected: "a reading above 0" } });
  });

  it("names columns by number when there is no header", () => {
    const { result } = readAll("1,2\n2,x\n3,4\n");
    expect(result).toMatchObject({ ok: false, error: { message: "Row 2, column 'Column 2': expected a number, got 'x'" } });
  });

  it("refuses a file with fewer than three readings", () => {
    expect(readAll("f,v\n1,2\n").result).toMatchObject({ ok: false, error: { expected: "at least 3 readings in the file" } });
  });

  it("reads in chunks with the same row numbers as in one go", () => {
    const layout = detectSweepCsvLayout("f,v\n1,1\n");
    const reader = new SweepRowReader(layout, layout.suggested);
    reader.accept([["f", "v"], ["1", "1"]]);
    reader.accept([[""], ["2", "1"], ["3", "oops"]]);
    expect(reader.finish()).toMatchObject({ ok: false, error: { row: 5, column: "v" } });
  });
});

describe("comment and preamble lines, empty and header-only files", () => {
  const scopeExport = [
    "# Bench scope export",
    "# Probe x10, source 20 Vpp",
    "Instrument: bench scope",
    "Date: 2026-12-01",
    "",
    "Freq (kHz);Vout (mV)",
    "100;250",
    "110;240",
    "120;230",
    "",
  ].join("\n");

  it("skips # comments and preamble lines above the header and reads the rows below it with their file row numbers", () => {
    const layout = detectSweepCsvLayout(scopeExport);
    expect(layout).toMatchObject({ delimiter: ";", hasHeader: true, headerRow: 6, firstDataRow: 7, columns: ["Freq (kHz)", "Vout (mV)"] });
    expect(layout.skippedRows.map((l) => l.row)).toEqual([1, 2, 3, 4]);
    expect(layout.suggested).toEqual({ frequencyColumn: 0, frequencyUnit: "kHz", amplitudeColumn: 1, amplitudeUnit: "mV" });
    expect(readSweepCsv(scopeExport, layout, layout.suggested)).toEqual({
      ok: true,
      points: [
        { row: 7, frequencyHz: 100e3, amplitudeV: 0.25 },
        { row: 8, frequencyHz: 110e3, amplitudeV: 0.24 },
        { row: 9, frequencyHz: 120e3, amplitudeV: 0.23 },
      ],
    });
  });

  it("lets the user pick another header row, or none, and reads from below it", () => {
    const text = "Sweep of KM-01\nf,v\nHz,V\n100000,1.5\n110000,1.4\n120000,1.3\n";
    const guessed = detectSweepCsvLayout(text);
    // The line just above the readings is taken as the header; the user knows the names are a line higher.
    expect(guessed.headerRow).toBe(3);
    expect(guessed.headerChoices.map((l) => l.row)).toEqual([1, 2, 3, 4]);
    const picked = detectSweepCsvLayout(text, { headerRow: 2 });
    expect(picked).toMatchObject({ headerRow: 2, firstDataRow: 3, columns: ["f", "v"] });
    // Row 3 ("Hz,V") is now below the header: refused by row and column, as any bad reading is.
    expect(readSweepCsv(text, picked, picked.suggested)).toMatchObject({ ok: false, error: { row: 3, column: "f", message: "Row 3, column 'f': expected a number, got 'Hz'" } });
    const none = detectSweepCsvLayout(text, { headerRow: null });
    expect(none).toMatchObject({ hasHeader: false, headerRow: null, firstDataRow: 4, columns: ["Column 1", "Column 2"] });
    expect(readSweepCsv(text, none, none.suggested)).toMatchObject({ ok: true });
  });

  it("says the file is empty, or that there are no readings after the header, with the row", () => {
    for (const empty of ["", "\n\n", "\uFEFF"]) {
      const layout = detectSweepCsvLayout(empty);
      expect(describeLayoutProblem(layout)).toBe("The file is empty");
      expect(readSweepCsv(empty, layout, layout.suggested)).toMatchObject({ ok: false, error: { message: expect.stringMatching(/^Row \d+: the file is empty$/) } });
    }
    const commentsOnly = detectSweepCsvLayout("# nothing measured yet\n# try again\n");
    expect(describeLayoutProblem(commentsOnly)).toMatch(/^The file is empty: it holds only comment or preamble lines/);

    const headerOnly = "# export\nFreq (kHz),Vout (mV)\n";
    const layout = detectSweepCsvLayout(headerOnly);
    expect(layout.headerRow).toBe(2);
    expect(describeLayoutProblem(layout)).toBe("Row 2: no readings after the header");
    expect(readSweepCsv(headerOnly, layout, layout.suggested)).toMatchObject({ ok: false, error: { row: 2, column: "", message: "Row 2: no readings after the header" } });
    expect(describeLayoutProblem(detectSweepCsvLayout("f,v\n1,2\n2,3\n3,4\n"))).toBeNull();
  });
});

describe("readDecimal", () => {
  it("accepts plain decimals and refuses anything else", () => {
    expect(readDecimal(" 3.25 ", false)).toBe(3.25);
    expect(readDecimal(".5", false)).toBe(0.5);
    expect(readDecimal("1e3", false)).toBe(1000);
    expect(readDecimal("1,5", false)).toBeNull();
    expect(readDecimal("1,5", true)).toBe(1.5);
    expect(readDecimal("1 000", false)).toBeNull();
    expect(readDecimal("", false)).toBeNull();
    expect(readDecimal("NaN", false)).toBeNull();
  });
});

describe("checkSweepReadings", () => {
  const names = { frequency: "F", amplitude: "A" };
  it("refuses a reading at or above the source amplitude and a repeated frequency, by row", () => {
    expect(checkSweepReadings([{ row: 2, frequencyHz: 1, amplitudeV: 20 }], 20, names)).toMatchObject({ row: 2, column: "A" });
    expect(
      checkSweepReadings(
        [
          { row: 2, frequencyHz: 1, amplitudeV: 1 },
          { row: 7, frequencyHz: 1, amplitudeV: 2 },
        ],
        20,
        names,
      ),
    ).toMatchObject({ row: 7, column: "F", expected: "a frequency not already read (row 2 has it)" });
    expect(checkSweepReadings([{ row: 2, frequencyHz: 1, amplitudeV: 1 }], 20, names)).toBeNull();
  });
});
