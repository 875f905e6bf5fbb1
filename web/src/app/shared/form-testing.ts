import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import type { Type } from '@angular/core';
import { TestBed } from '@angular/core/testing';
import { MATERIAL_ANIMATIONS } from '@angular/material/core';
import { HttpErrorResponse } from '@angular/common/http';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';

/** A refusal as the API sends it (`{ error: { code, message, details } }`), for specs. */
export function problemResponse(
  status: number,
  message: string,
  details?: unknown,
): HttpErrorResponse {
  return new HttpErrorResponse({ status, error: { error: { code: 'x', message, details } } });
}

/** A form's fields by their label and its buttons by their text, through Material's harnesses. */
export function formFields(loader: HarnessLoader) {
  const field = (label: string) =>
    loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }));
  return {
    field,
    fill: async (label: string, value: string) =>
      (await (await field(label)).getControl(MatInputHarness))!.setValue(value),
    press: async (text: string) =>
      (await loader.getHarness(MatButtonHarness.with({ text }))).click(),
  };
}

/** A spec's host component, rendered and settled with animations off, and its harness loader. */
export async function renderHost<T>(host: Type<T>) {
  TestBed.configureTestingModule({
    providers: [{ provide: MATERIAL_ANIMATIONS, useValue: { animationsDisabled: true } }],
  });
  const fixture = TestBed.createComponent(host);
  await fixture.whenStable();
  return { fixture, loader: TestbedHarnessEnvironment.loader(fixture) };
}
