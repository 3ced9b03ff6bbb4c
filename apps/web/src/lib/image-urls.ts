import { apiUrl } from './api-client';

export type Rendition = 'thumbnail' | 'preview' | 'full' | 'original';

/** A stored image in one of its renditions; every screen that shows a still uses this. */
export const imageUrl = (id: string, rendition: Rendition) =>
  apiUrl(`/images/${encodeURIComponent(id)}/${rendition}`);
