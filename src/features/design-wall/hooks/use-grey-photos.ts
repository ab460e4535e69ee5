import { useEffect, useState } from 'react';
import type { DesignBlockDto } from '@shared/schemas/designs';
import { greyCopy } from '../lib/value-view';

/** While the value view is on, an L*-only copy of each block's photo thumbnail, by block id. */
export function useGreyPhotos(blocks: DesignBlockDto[], on: boolean): Map<number, string> {
  const [grey, setGrey] = useState<Map<number, string>>(new Map());
  useEffect(() => {
    if (!on) return;
    let cancelled = false;
    for (const b of blocks) {
      if (!b.photo || grey.has(b.id)) continue;
      const img = new Image();
      img.onload = () => {
        if (cancelled) return;
        const url = greyCopy(img);
        setGrey((m) => new Map(m).set(b.id, url));
      };
      img.src = b.photo.thumbUrl;
    }
    return () => {
      cancelled = true;
    };
    // grey is read only to skip photos already done
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [blocks, on]);
  return grey;
}
