import { useState } from 'react';
import { catalogueItemTypeLabels, type CatalogueItem } from '#shared/schemas/catalogue.ts';
import { Banner } from '@/components/ui/banner.tsx';
import { Button } from '@/components/ui/button.tsx';
import { Dialog } from '@/components/ui/dialog.tsx';
import { Loading, Page } from '@/components/ui/page.tsx';
import { useToast } from '@/components/ui/toast.tsx';
import { cn } from '@/lib/cn.ts';
import { errorMessage } from '@/lib/api.ts';
import { useCatalogue, useCreateItem, useReplaceItem, useSetItemActive } from '../api/catalogue.ts';
import { ItemForm } from './item-form.tsx';

/** The unit's device catalogue, for its administrator: add, edit, take out of use, bring back. */
export function CatalogueScreen({ canManage }: { canManage: boolean }) {
  const [showRetired, setShowRetired] = useState(false);
  const query = useCatalogue(showRetired);
  const create = useCreateItem();
  const replace = useReplaceItem();
  const setActive = useSetItemActive();
  const notify = useToast();
  const [adding, setAdding] = useState(false);
  const [editing, setEditing] = useState<CatalogueItem | null>(null);

  const toggle = (item: CatalogueItem) => setActive.mutate({ id: item.id, active: !item.active }, {
    onSuccess: (i) => notify(i.active ? `"${i.description}" is back in use` : `"${i.description}" is out of use`),
    onError: (e) => notify(errorMessage(e), 'danger'),
  });

  return (
    <Page title="Device catalogue" wide actions={canManage && !adding ? <Button variant="primary" size="lg" onClick={() => setAdding(true)}>Add an item</Button> : undefined}>
      <div className="flex flex-col gap-6">
        <p className="text-lg text-muted">What can be scanned or chosen during a case. Items stay on record once used: take an item out of use rather than remove it.</p>
        {adding && (
          <section aria-label="Add an item" className="rounded-card border-2 border-primary bg-surface p-5 shadow-card">
            <h2 className="mb-4 text-2xl font-bold">Add an item</h2>
            <ItemForm submitLabel="Add to the catalogue" onCancel={() => setAdding(false)}
              onSubmit={async (input) => { const i = await create.mutateAsync(input); notify(`"${i.description}" added`); setAdding(false); }} />
          </section>
        )}
        <label className="inline-flex min-h-touch items-center gap-3 self-start font-bold">
          <input type="checkbox" className="size-6" checked={showRetired} onChange={(e) => setShowRetired(e.target.checked)} />
          Show items out of use
        </label>
        {query.isPending && <Loading label="Loading the catalogue" />}
        {query.error && <Banner tone="danger" title="The catalogue could not be read">{errorMessage(query.error)}</Banner>}
        {query.data && query.data.length === 0 && <p className="text-lg">The catalogue is empty.</p>}
        {query.data && query.data.length > 0 && (
          <ul className="flex flex-col gap-3" aria-label="Catalogue items">
            {query.data.map((item) => (
              <li key={item.id} aria-label={item.description}
                className={cn('grid gap-3 rounded-card border-2 bg-surface p-4 md:grid-cols-[1fr_auto] md:items-center', item.active ? 'border-line' : 'border-dashed border-line-strong opacity-80')}>
                <div className="min-w-0">
                  <p className="text-xl font-bold">{item.description}</p>
                  <p className="mt-1 flex flex-wrap items-baseline gap-x-5 gap-y-1 text-base">
                    <span className="text-muted">{catalogueItemTypeLabels[item.type]}{!item.active && ' · out of use'}</span>
                    {item.sizeLabel && <span><span className="font-bold text-muted">Size </span>{item.sizeLabel}</span>}
                    {item.gtin && <span><span className="font-bold text-muted">GTIN </span><span className="font-mono">{item.gtin}</span></span>}
                    {item.hibccLabeler && <span><span className="font-bold text-muted">HIBC </span><span className="font-mono">{item.hibccLabeler} {item.hibccProduct}</span></span>}
                  </p>
                </div>
                {canManage && (
                  <div className="flex flex-wrap gap-2">
                    <Button onClick={() => setEditing(item)} aria-label={`Edit ${item.description}`}>Edit</Button>
                    <Button variant={item.active ? 'danger' : 'secondary'} onClick={() => toggle(item)} aria-label={`${item.active ? 'Take out of use' : 'Bring back into use'}: ${item.description}`}>
                      {item.active ? 'Take out of use' : 'Bring back'}
                    </Button>
                  </div>
                )}
              </li>
            ))}
          </ul>
        )}
      </div>
      <Dialog open={editing !== null} onClose={() => setEditing(null)} title="Edit the item">
        {editing && (
          <ItemForm key={editing.id} item={editing} submitLabel="Save the item" onCancel={() => setEditing(null)}
            onSubmit={async (input) => { await replace.mutateAsync({ id: editing.id, input }); notify('Item saved'); setEditing(null); }} />
        )}
      </Dialog>
    </Page>
  );
}
