import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { ReportDownloads } from './report-downloads';

/** Stands for the download button: shows what it was given. */
@Component({
  selector: 'app-download-button',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `<a [attr.data-testid]="testId()" [attr.data-path]="path()">{{ label() }}</a>`,
})
class ButtonStub {
  readonly path = input.required<string>();
  readonly label = input.required<string>();
  readonly testId = input.required<string>();
}

async function render(inputs: Record<string, unknown>) {
  TestBed.configureTestingModule({ imports: [ReportDownloads] });
  TestBed.overrideComponent(ReportDownloads, { set: { imports: [ButtonStub] } });
  const fixture = TestBed.createComponent(ReportDownloads);
  fixture.componentRef.setInput('roundId', 'r1');
  for (const [k, v] of Object.entries(inputs)) fixture.componentRef.setInput(k, v);
  await fixture.whenStable();
  const host = fixture.nativeElement as HTMLElement;
  const group = host.querySelector('[role="group"]');
  const buttons = Array.from(host.querySelectorAll('a')).map((a) => [
    a.dataset['testid'],
    a.dataset['path'],
    a.textContent,
  ]);
  return { label: group?.getAttribute('aria-label'), buttons };
}

describe('ReportDownloads', () => {
  it('offers the round report and workbook to anyone who may read them', async () => {
    expect(await render({})).toEqual({
      label: 'Report downloads',
      buttons: [
        ['download-round-pdf', '/rounds/r1/reports/round.pdf', 'Round report (PDF)'],
        ['download-round-xlsx', '/rounds/r1/reports/round.xlsx', 'Round workbook (Excel)'],
      ],
    });
  });

  it('adds the lab’s individual report and certificate, naming a lab only for those', async () => {
    const { buttons } = await render({ labId: 'lab9' });
    expect(buttons.map((b) => b[1])).toEqual([
      '/rounds/r1/reports/round.pdf',
      '/rounds/r1/reports/round.xlsx',
      '/rounds/r1/reports/participant.pdf?labId=lab9',
      '/rounds/r1/reports/certificate.pdf?labId=lab9',
    ]);
    TestBed.resetTestingModule();
    const own = await render({ own: true });
    expect(own.buttons.map((b) => b[0])).toEqual([
      'download-round-pdf',
      'download-round-xlsx',
      'download-participant-pdf',
      'download-certificate-pdf',
    ]);
    expect(own.buttons[2]![1]).toBe('/rounds/r1/reports/participant.pdf');
  });

  it('offers a precision study’s report and workbook only', async () => {
    expect(await render({ precision: true })).toEqual({
      label: 'Precision report downloads',
      buttons: [
        ['download-precision-pdf', '/rounds/r1/reports/precision.pdf', 'Precision report (PDF)'],
        [
          'download-precision-xlsx',
          '/rounds/r1/reports/precision.xlsx',
          'Precision workbook (Excel)',
        ],
      ],
    });
  });
});
