/** How a block answer refers to one of its photos: the routes that serve it, full size and thumbnail. */
import type { PhotoRefDto } from '@shared/swap-types';

export function photoRef(id: number): PhotoRefDto {
  return { id, url: `/api/photos/${id}`, thumbUrl: `/api/photos/${id}?size=thumb` };
}
