import ExcelJS from 'exceljs';
import { syntheticReportInput } from '../testing/synthetic-input';
import { neutraliseFormula } from '../text';
import { buildRoundWorkbook, sheetName } from './round-workbook';

async function read(buf: Buffer): Promise<ExcelJS.Workbook> {
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.load(buf as never);
  return wb;
}

describe('round workbook', () => {
  const input = syntheticReportInput({ participants: 30, blunders: [3] });

  it('holds the evaluation’s numbers: x_pt, u(x_pt), σ_pt and n on the summary, scores per participant', async () => {
    const wb = await read(await buildRoundWorkbook(input));
    expect(wb.worksheets.map((w) => w.name)).toEqual([
      'Summary',
      'A Z-average',
      'A PDI',
      'B Z-average',
      'B PDI',
      'Homogeneity and stability',
    ]);
    const summary = wb.getWorksheet('Summary')!;
    const g = input.groups[0]!;
    const row = summary.getRow(15); // 12 report rows, a blank row, the header
    expect(row.getCell(1).value).toBe('A');
    expect(row.getCell(6).value).toBe(g.assignedValue);
    expect(row.getCell(7).value).toBe(g.uAssigned);
    expect(row.getCell(8).value).toBe(g.sigmaPt);
    expect(row.getCell(10).value).toBe(g.n);
    expect(typeof g.assignedValue).toBe('number');

    const sheet = wb.getWorksheet('A Z-average')!;
    expect(sheet.getRow(4).getCell(1).value).toBe('Participant');
    expect(sheet.views[0]).toMatchObject({ state: 'frozen', ySplit: 4, xSplit: 1 });
    // Row 5 on: one row per participant, in the stored order.
    g.participants.forEach((p, i) => {
      const r = sheet.getRow(5 + i);
      expect(r.getCell(1).value).toBe(p.code);
      expect(r.getCell(2).value).toBe(g.replicates[p.code]![0]);
      expect(r.getCell(5).value).toBe(p.result);
      expect(r.getCell(8).value).toBe(p.z);
      expect(r.getCell(5).numFmt).toBe('0.0'); // Z-average: 1 decimal
    });
    // The doubled lab is an action signal with a radius/diameter hint in general words.
    const blunder = g.participants.findIndex((p) => p.code === 'P004');
    const br = sheet.getRow(5 + blunder);
    expect(br.getCell(15).value).toBe('action signal');
    expect(br.getCell(16).text).toMatch(/radius/);
    expect(wb.getWorksheet('A PDI')!.getRow(5).getCell(5).numFmt).toBe('0.000');
  });

  it('lists the homogeneity and stability studies', async () => {
    const wb = await read(await buildRoundWorkbook(input));
    const ws = wb.getWorksheet('Homogeneity and stability')!;
    expect(ws.getRow(3).getCell(3).value).toBe('Homogeneity study');
    expect(ws.getRow(3).getCell(10).value).toBe(0.12);
    expect(ws.getRow(4).getCell(13).value).toBe(0.2);
  });

  it('neutralises user text starting with = + - @ so no formula runs', async () => {
    const hostile = '=HYPERLINK("http://x.test","click")';
    const wb = await read(
      await buildRoundWorkbook(
        syntheticReportInput({
          participants: 15,
          hostileText: hostile,
          reissueReason: '+1 corrected σ_pt',
        }),
      ),
    );
    const summary = wb.getWorksheet('Summary')!;
    expect(summary.getRow(7).getCell(2).value).toBe(`'+1 corrected σ_pt`);
    expect(summary.getRow(1).getCell(2).value).toBe(`SYN-2025-1 · ${hostile}`); // starts with the code: stays text
    expect(wb.getWorksheet('B PDI')!.getRow(5).getCell(17).value).toBe(
      `Other (see reason): ${hostile}`,
    );
    expect(neutraliseFormula('@SUM(A1)')).toBe(`'@SUM(A1)`);
    expect(neutraliseFormula('-2+3')).toBe(`'-2+3`);
    expect(neutraliseFormula('P001')).toBe('P001');
    let formulas = 0;
    for (const ws of wb.worksheets)
      ws.eachRow((r) =>
        r.eachCell((c) => void (c.type === ExcelJS.ValueType.Formula && formulas++)),
      );
    expect(formulas).toBe(0);
  });

  it('makes valid unique sheet names', () => {
    const taken = new Set<string>();
    expect(sheetName('A: size/[x]?', taken)).toBe('A size x');
    expect(sheetName('A: size/[x]?', taken)).toBe('A size x 2');
    expect(sheetName('x'.repeat(40), taken).length).toBeLessThanOrEqual(31);
  });

  it('stores dates as dates, filters every table, colours signals by rule and prints fitted to the page width', async () => {
    const wb = await read(await buildRoundWorkbook(input));
    const summary = wb.getWorksheet('Summary')!;
    const issue = summary.getRow(6);
    expect(issue.getCell(1).value).toBe('Issue date (published)');
    expect(issue.getCell(2).value).toBeInstanceOf(Date);
    expect((issue.getCell(2).value as Date).toISOString()).toBe(input.evaluation.publishedAt);
    expect(summary.getRow(9).getCell(2).value).toBeInstanceOf(Date); // results due
    // No label is wider than its column (the Summary cut its labels before).
    for (let r = 1; r <= 12; r++)
      expect(summary.getRow(r).getCell(1).text.length).toBeLessThanOrEqual(
        summary.getColumn(1).width!,
      );
    const sheet = wb.getWorksheet('A Z-average')!;
    expect(sheet.autoFilter).toBeTruthy();
    expect(summary.autoFilter).toBeTruthy();
    for (const ws of wb.worksheets)
      expect(ws.pageSetup).toMatchObject({
        fitToPage: true,
        fitToWidth: 1,
        fitToHeight: 0,
        orientation: 'landscape',
      });
    const cf = (
      sheet as unknown as {
        conditionalFormattings: { ref: string; rules: { formulae: string[] }[] }[];
      }
    ).conditionalFormattings;
    const words = cf.flatMap((c) =>
      c.rules.map((r) => /SEARCH\("([^"]+)"/.exec(r.formulae[0]!)?.[1]),
    );
    expect(words.sort()).toEqual(['acceptable', 'action signal', 'warning signal']);
    // One wording: "warning signal" and "action signal" everywhere, never a bare "Warning"/"Action" header.
    const heads = summary.getRow(14).values as unknown[];
    expect(heads).toEqual(expect.arrayContaining(['Warning signal', 'Action signal']));
  });
});
