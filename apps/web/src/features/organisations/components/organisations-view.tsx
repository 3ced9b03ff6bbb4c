import { useState } from 'react';
import { contactInputSchema, organisationInputSchema } from '@emberline/contracts/organisations';
import { Button } from '../../../components/ui/button';
import { Field, Input } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { LoadingLine, Panel } from '../../../components/ui/page';
import { applyServerErrors, useZodForm } from '../../../lib/form';
import {
  useAddContact,
  useCreateOrganisation,
  useOrganisation,
  useOrganisationsPage,
  useRemoveContact,
} from '../api/organisations';

function NewOrganisationForm({ onCreated }: { onCreated: (id: string) => void }) {
  const create = useCreateOrganisation();
  const [error, setError] = useState('');
  const form = useZodForm(organisationInputSchema, { defaultValues: { name: '' } });
  const onSubmit = form.handleSubmit((values) =>
    create.mutate(values, {
      onSuccess: (organisation) => {
        form.reset();
        onCreated(organisation.id);
      },
      onError: (failure) => setError(applyServerErrors(form, failure)),
    }),
  );
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3">
      {error ? <Notice tone="error">{error}</Notice> : null}
      <Field label="New customer organisation" error={form.formState.errors.name}>
        {(props) => <Input {...props} {...form.register('name')} />}
      </Field>
      <Button type="submit" variant="secondary" busy={create.isPending} className="self-start">
        Add organisation
      </Button>
    </form>
  );
}

function Contacts({ organisationId }: { organisationId: string }) {
  const organisation = useOrganisation(organisationId);
  const add = useAddContact(organisationId);
  const remove = useRemoveContact(organisationId);
  const [error, setError] = useState('');
  const form = useZodForm(contactInputSchema, {
    defaultValues: { name: '', email: '', role: '', receivesReports: true, receivesUrgent: true },
  });
  const onSubmit = form.handleSubmit((values) => {
    setError('');
    add.mutate(values, {
      onSuccess: () => form.reset(),
      onError: (failure) => setError(applyServerErrors(form, failure)),
    });
  });
  if (organisation.isPending) return <LoadingLine />;
  if (organisation.error) return <Notice tone="error">{organisation.error.message}</Notice>;
  const data = organisation.data;
  return (
    <div className="flex flex-col gap-4">
      <div>
        <h2 className="text-lg font-semibold">{data.name}</h2>
        <p className="text-sm text-soot-600">
          {data.kind === 'home'
            ? 'Home organisation'
            : `Customer · ${data.engineCount} engine${data.engineCount === 1 ? '' : 's'}`}
        </p>
      </div>
      {data.kind === 'customer' ? (
        <>
          <h3 className="font-semibold">Report contacts</h3>
          <p className="text-sm text-soot-600">
            Signed reports are e-mailed to these addresses only.
          </p>
          {data.contacts.length === 0 ? (
            <p className="text-sm">No contacts yet.</p>
          ) : (
            <ul className="divide-y divide-soot-100 rounded-md border border-soot-200">
              {data.contacts.map((contact) => (
                <li
                  key={contact.id}
                  className="flex items-center justify-between gap-3 px-3 py-2 text-sm"
                >
                  <span>
                    <span className="font-medium">{contact.name}</span> · {contact.role} ·{' '}
                    <span className="font-mono">{contact.email}</span>
                    <span className="block text-xs text-soot-600">
                      {[
                        contact.receivesReports ? 'gets signed reports' : null,
                        contact.receivesUrgent ? 'gets urgent notices' : null,
                      ]
                        .filter(Boolean)
                        .join(' and ') || 'gets no e-mail'}
                    </span>
                  </span>
                  <Button
                    variant="ghost"
                    onClick={() => remove.mutate(contact.id)}
                    aria-label={`Remove ${contact.name}`}
                  >
                    Remove
                  </Button>
                </li>
              ))}
            </ul>
          )}
          <form
            onSubmit={onSubmit}
            noValidate
            className="grid gap-3 md:grid-cols-3"
            aria-label="Add a report contact"
          >
            {error ? (
              <div className="md:col-span-3">
                <Notice tone="error">{error}</Notice>
              </div>
            ) : null}
            <Field label="Contact name" error={form.formState.errors.name}>
              {(props) => <Input {...props} {...form.register('name')} />}
            </Field>
            <Field label="Contact e-mail" error={form.formState.errors.email}>
              {(props) => <Input {...props} type="email" {...form.register('email')} />}
            </Field>
            <Field label="What they do" error={form.formState.errors.role}>
              {(props) => (
                <Input {...props} placeholder="Technical records" {...form.register('role')} />
              )}
            </Field>
            <fieldset className="flex flex-wrap gap-4 text-sm md:col-span-3">
              <legend className="sr-only">What they get</legend>
              <label className="flex items-center gap-2">
                <input type="checkbox" {...form.register('receivesReports')} />
                Signed reports of released inspections
              </label>
              <label className="flex items-center gap-2">
                <input type="checkbox" {...form.register('receivesUrgent')} />
                Urgent notices (removal before the next flight)
              </label>
            </fieldset>
            <Button type="submit" variant="secondary" busy={add.isPending} className="self-start">
              Add contact
            </Button>
          </form>
        </>
      ) : null}
    </div>
  );
}

export function OrganisationsView() {
  const organisations = useOrganisationsPage();
  const [selected, setSelected] = useState<string | null>(null);
  if (organisations.isPending) return <LoadingLine />;
  if (organisations.error) return <Notice tone="error">{organisations.error.message}</Notice>;
  const { items, total } = organisations.data;
  const current =
    selected ?? items.find((organisation) => organisation.kind === 'customer')?.id ?? null;
  return (
    <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_minmax(0,2fr)]">
      <Panel className="flex flex-col gap-4">
        <ul className="flex flex-col gap-1" aria-label="Organisations">
          {items.map((organisation) => (
            <li key={organisation.id}>
              <button
                type="button"
                onClick={() => setSelected(organisation.id)}
                aria-current={current === organisation.id || undefined}
                className={`w-full rounded-md px-3 py-2 text-left text-sm ${current === organisation.id ? 'bg-ember-50 font-medium text-ember-900' : 'hover:bg-soot-100'}`}
              >
                {organisation.name}
                <span className="block text-xs text-soot-600">
                  {organisation.kind === 'home' ? 'Home organisation' : 'Customer'}
                </span>
              </button>
            </li>
          ))}
        </ul>
        {total > items.length ? (
          <p className="text-xs text-soot-600">
            The first {items.length} of {total} organisations, by name.
          </p>
        ) : null}
        <NewOrganisationForm onCreated={setSelected} />
      </Panel>
      <Panel>
        {current ? (
          <Contacts organisationId={current} />
        ) : (
          <p className="text-sm">Choose an organisation.</p>
        )}
      </Panel>
    </div>
  );
}
