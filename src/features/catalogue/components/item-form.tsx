import { useState } from 'react';
import {
  catalogueItemTypeLabels, catalogueItemTypes, createCatalogueItemSchema, type CatalogueItem, type CreateCatalogueItemInput,
} from '#shared/schemas/catalogue.ts';
import { Button } from '@/components/ui/button.tsx';
import { Field, Input, Select } from '@/components/ui/field.tsx';
import { ApiError, errorMessage } from '@/lib/api.ts';

type Draft = { description: string; type: string; sizeLabel: string; gtin: string; hibccLabeler: string; hibccProduct: string };
const draftOf = (i?: CatalogueItem): Draft => ({
  description: i?.description ?? '', type: i?.type ?? 'clip', sizeLabel: i?.sizeLabel ?? '', gtin: i?.gtin ?? '',
  hibccLabeler: i?.hibccLabeler ?? '', hibccProduct: i?.hibccProduct ?? '',
});

type Props = {
  item?: CatalogueItem;
  submitLabel: string;
  onSubmit: (input: CreateCatalogueItemInput) => Promise<unknown>;
  onCancel?: () => void;
};

/**
 * Add or edit an item. The fields are checked with the same schema as the server, so a GTIN whose check
 * digit fails is caught here with the digit it should have (GS1 check digit, shared parser).
 */
export function ItemForm({ item, submitLabel, onSubmit, onCancel }: Props) {
  const [d, setD] = useState<Draft>(() => draftOf(item));
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [failure, setFailure] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);
  const set = (k: keyof Draft) => (e: { target: { value: string } }) => { setD((x) => ({ ...x, [k]: e.target.value })); setErrors((x) => ({ ...x, [k]: '' })); };

  const submit = async () => {
    const parsed = createCatalogueItemSchema.safeParse(d);
    if (!parsed.success) {
      setErrors(Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0] ?? 'description'), i.message])));
      return;
    }
    setBusy(true);
    setFailure(null);
    try {
      await onSubmit(d as CreateCatalogueItemInput);
      if (!item) setD(draftOf());
    } catch (err) {
      if (err instanceof ApiError) setErrors(err.fieldErrors());
      setFailure(errorMessage(err));
    } finally {
      setBusy(false);
    }
  };

  return (
    <form className="flex flex-col gap-4" aria-label={item ? `Edit ${item.description}` : 'Add an item'} onSubmit={(e) => { e.preventDefault(); void submit(); }} noValidate>
      <div className="grid gap-4 md:grid-cols-2">
        <Field label="Generic description" hint="What the device is, never a brand: “Through-the-scope clip, rotatable”." required error={errors.description} className="md:col-span-2">
          {(c) => <Input {...c} value={d.description} maxLength={200} onChange={set('description')} />}
        </Field>
        <Field label="Type" required error={errors.type}>
          {(c) => (
            <Select {...c} value={d.type} onChange={set('type')}>
              {catalogueItemTypes.map((t) => <option key={t} value={t}>{catalogueItemTypeLabels[t]}</option>)}
            </Select>
          )}
        </Field>
        <Field label="Size" hint="As the package says: “11 mm”." error={errors.sizeLabel}>
          {(c) => <Input {...c} value={d.sizeLabel} maxLength={40} onChange={set('sizeLabel')} />}
        </Field>
        <Field label="GTIN" hint="8, 12, 13 or 14 digits, from the label's (01)." error={errors.gtin} className="md:col-span-2">
          {(c) => <Input {...c} value={d.gtin} inputMode="numeric" autoComplete="off" className="font-mono" onChange={set('gtin')} />}
        </Field>
        <Field label="HIBCC labeler code" hint="Four characters, a letter first." error={errors.hibccLabeler}>
          {(c) => <Input {...c} value={d.hibccLabeler} maxLength={4} autoComplete="off" className="font-mono uppercase" onChange={set('hibccLabeler')} />}
        </Field>
        <Field label="HIBCC product code" hint="Up to 18 letters or digits." error={errors.hibccProduct}>
          {(c) => <Input {...c} value={d.hibccProduct} maxLength={18} autoComplete="off" className="font-mono uppercase" onChange={set('hibccProduct')} />}
        </Field>
      </div>
      {failure && <p role="alert" className="font-bold text-danger">{failure}</p>}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" variant="primary" size="lg" busy={busy}>{submitLabel}</Button>
        {onCancel && <Button size="lg" onClick={onCancel}>Cancel</Button>}
      </div>
    </form>
  );
}
