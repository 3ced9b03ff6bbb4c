import { useState } from 'react';
import type { EngineModelRow } from '@emberline/contracts/fleet';
import type { Image } from '@emberline/contracts/inspections';
import { Button } from '../../../components/ui/button';
import { Input, Select } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { useTagImage } from '../api/inspections';

/** The row and position a still shows: a form while the inspection is a draft, a line after. */
export function ImageTagForm({
  image,
  rows,
  inspectionId,
  ports,
  editable,
}: {
  image: Image;
  rows: EngineModelRow[];
  inspectionId: string;
  /** The ports already named in this inspection, offered as the inspector types. */
  ports: string[];
  editable: boolean;
}) {
  const tag = useTagImage(inspectionId);
  const [rowKey, setRowKey] = useState(image.rowKey ?? '');
  const [position, setPosition] = useState(image.position ? String(image.position) : '');
  const [port, setPort] = useState(image.port ?? '');
  const row = rows.find((candidate) => candidate.key === rowKey);
  const listId = `ports-${image.id}`;
  if (!editable) {
    const shown = rows.find((candidate) => candidate.key === image.rowKey);
    return (
      <p className="text-sm">
        {image.rowKey
          ? `Shows ${shown?.label ?? 'a row not on this model'}, position ${image.position}`
          : 'Not tagged with a row and position.'}
        {image.port ? ` Taken through ${image.port}.` : ''}
      </p>
    );
  }
  return (
    <form
      className="flex flex-wrap items-end gap-2"
      aria-label="Row and position shown"
      onSubmit={(event) => {
        event.preventDefault();
        tag.mutate({
          imageId: image.id,
          tag: {
            ...(rowKey ? { rowKey, position: Number(position) } : { rowKey: null, position: null }),
            port: port.trim() || null,
          },
        });
      }}
    >
      <label className="flex flex-col gap-1 text-sm">
        Row shown
        <Select value={rowKey} onChange={(event) => setRowKey(event.target.value)}>
          <option value="">None</option>
          {rows.map((candidate) => (
            <option key={candidate.key} value={candidate.key}>
              {candidate.label}
            </option>
          ))}
        </Select>
      </label>
      <label className="flex flex-col gap-1 text-sm">
        Position {row ? `(1–${row.count})` : ''}
        <Input
          type="number"
          min={1}
          max={row?.count}
          value={position}
          onChange={(event) => setPosition(event.target.value)}
          className="w-24"
          disabled={!rowKey}
        />
      </label>
      <label className="flex flex-col gap-1 text-sm">
        Port
        <Input
          value={port}
          onChange={(event) => setPort(event.target.value)}
          list={listId}
          maxLength={40}
          placeholder="e.g. Igniter port, left"
          className="w-48"
        />
        <datalist id={listId}>
          {ports.map((name) => (
            <option key={name} value={name} />
          ))}
        </datalist>
      </label>
      <Button type="submit" variant="secondary" busy={tag.isPending}>
        Save tag
      </Button>
      {tag.error ? <Notice tone="error">{tag.error.message}</Notice> : null}
    </form>
  );
}
