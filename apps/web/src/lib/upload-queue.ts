import { createContext } from 'react';
import type { UploadResponse } from '@emberline/contracts/inspections';

export type UploadStatus =
  'queued' | 'uploading' | 'done' | 'duplicate' | 'refused' | 'failed' | 'cancelled';

export interface UploadItem {
  id: string;
  name: string;
  size: number;
  /** Where the file goes: the feature that enqueues it builds the address through its API file. */
  url: string;
  status: UploadStatus;
  /** 0..1 of the bytes sent. */
  progress: number;
  message: string | null;
}

interface Entry {
  item: UploadItem;
  file: Blob;
  fields: Record<string, string>;
  onDone?: () => void;
  request?: XMLHttpRequest;
  /** After a 429: not sent again before this time (ms since the epoch). */
  notBefore?: number;
}

// Two files in flight: the server's pipeline takes two at a time, and each file gets its own
// request so that it has its own progress, cancel and retry.
const PARALLEL = 2;
const finished: UploadStatus[] = ['done', 'duplicate', 'cancelled'];

/**
 * The upload queue of this browser tab. It lives above the pages, so that uploads go on while the
 * inspector moves around the app. Each file is sent alone, with progress from XMLHttpRequest.
 */
export class UploadQueue {
  private entries = new Map<string, Entry>();
  private listeners = new Set<() => void>();
  private snapshot: UploadItem[] = [];
  private counter = 0;

  subscribe = (listener: () => void) => {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  };

  items = () => this.snapshot;

  enqueue(
    url: string,
    files: { file: Blob; name: string; fields?: Record<string, string> }[],
    onDone?: () => void,
  ): void {
    for (const { file, name, fields } of files) {
      this.counter += 1;
      const item: UploadItem = {
        id: `upload-${this.counter}`,
        name,
        size: file.size,
        url,
        status: 'queued',
        progress: 0,
        message: null,
      };
      this.entries.set(item.id, { item, file, fields: fields ?? {}, onDone });
    }
    this.changed();
    this.pump();
  }

  cancel(id: string): void {
    const entry = this.entries.get(id);
    if (entry?.item.status === 'uploading') entry.request?.abort();
    else if (entry?.item.status === 'queued') this.update(entry, { status: 'cancelled' });
  }

  retry(id: string): void {
    const entry = this.entries.get(id);
    if (!entry || !['failed', 'cancelled'].includes(entry.item.status)) return;
    this.update(entry, { status: 'queued', progress: 0, message: null });
    this.pump();
  }

  clearFinished(): void {
    for (const [id, entry] of this.entries)
      if (finished.includes(entry.item.status)) this.entries.delete(id);
    this.changed();
  }

  private changed(): void {
    this.snapshot = [...this.entries.values()].map((entry) => entry.item);
    for (const listener of this.listeners) listener();
  }

  private update(entry: Entry, changes: Partial<UploadItem>): void {
    entry.item = { ...entry.item, ...changes };
    this.changed();
  }

  private pump(): void {
    const all = [...this.entries.values()];
    let running = all.filter((entry) => entry.item.status === 'uploading').length;
    for (const entry of all) {
      if (running >= PARALLEL) return;
      if (entry.item.status !== 'queued') continue;
      if (entry.notBefore && entry.notBefore > Date.now()) continue;
      running += 1;
      this.send(entry);
    }
  }

  private send(entry: Entry): void {
    const request = new XMLHttpRequest();
    entry.request = request;
    const form = new FormData();
    for (const [key, value] of Object.entries(entry.fields)) form.append(key, value);
    form.append('files', entry.file, entry.item.name);
    request.open('POST', entry.item.url);
    request.responseType = 'json';
    request.upload.onprogress = (event) => {
      if (event.lengthComputable) this.update(entry, { progress: event.loaded / event.total });
    };
    request.onload = () => {
      const body = request.response as (UploadResponse & { error?: { message: string } }) | null;
      const refusal = body?.rejected?.[0];
      if (request.status === 429) {
        // The server's upload limit: the file waits its turn and goes again by itself.
        const seconds = Math.max(1, Number(request.getResponseHeader('Retry-After')) || 5);
        entry.notBefore = Date.now() + seconds * 1000;
        this.update(entry, {
          status: 'queued',
          progress: 0,
          message: `The server asked for a pause: sending again in ${seconds} s`,
        });
        setTimeout(() => this.pump(), seconds * 1000);
        this.pump();
        return;
      }
      if (request.status === 201)
        this.update(entry, { status: 'done', progress: 1, message: null });
      else if (refusal?.code === 'duplicate')
        this.update(entry, { status: 'duplicate', progress: 1, message: refusal.message });
      else if (request.status === 413 || request.status === 415)
        this.update(entry, {
          status: 'refused',
          message: refusal?.message ?? body?.error?.message ?? 'Refused',
        });
      else
        this.update(entry, {
          status: 'failed',
          message: body?.error?.message ?? `The server answered ${request.status}`,
        });
      entry.onDone?.();
      this.pump();
    };
    request.onerror = () => {
      this.update(entry, {
        status: 'failed',
        message: 'The connection was lost; retry when it is back.',
      });
      this.pump();
    };
    request.onabort = () => {
      this.update(entry, { status: 'cancelled', message: null });
      this.pump();
    };
    this.update(entry, { status: 'uploading', progress: 0, message: null });
    request.send(form);
  }
}

export const UploadQueueContext = createContext<UploadQueue | null>(null);
