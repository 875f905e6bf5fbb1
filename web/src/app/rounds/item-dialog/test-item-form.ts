import type { NonNullableFormBuilder } from '@angular/forms';
import type { TestItem } from '@ringlet/shared/contracts/rounds';
import { numberOrNull } from '../../shared/form-values';

/** One test item as its form holds it (the item dialog, and each item of the new-round dialog). */
export interface TestItemForm {
  code: string;
  material: string;
  nominalSizeNm: number | null;
  storageNotes: string;
  handlingNotes: string;
}

/** The form group of one test item, empty or filled from a stored item. */
export function testItemGroup(fb: NonNullableFormBuilder, item?: TestItem) {
  return fb.group({
    code: [item?.code ?? ''],
    material: [item?.material ?? ''],
    nominalSizeNm: [item?.nominalSizeNm ?? (null as number | null)],
    storageNotes: [item?.storageNotes ?? ''],
    handlingNotes: [item?.handlingNotes ?? ''],
  });
}

/** The contract's fields from the form: an empty nominal size is none. */
export function testItemFromForm(raw: TestItemForm): TestItemForm {
  return { ...raw, nominalSizeNm: numberOrNull(raw.nominalSizeNm) };
}
