import { useCallback, useState } from 'react';
import { checkChosenFile, MAX_PHOTOS_PER_UPLOAD } from '@shared/schemas/photos';

export interface ChosenPhoto {
  key: string;
  file: File;
}

const keyOf = (file: File) => `${file.name}|${file.size}|${file.lastModified}`;

/**
 * The files a person has chosen to send, checked in the browser first (type, size, count) so most
 * mistakes are explained before anything is sent. The list survives a failed upload.
 */
export function usePhotoChoice() {
  const [chosen, setChosen] = useState<ChosenPhoto[]>([]);
  const [notices, setNotices] = useState<string[]>([]);

  const add = useCallback(
    (files: readonly File[]) => {
      const messages: string[] = [];
      const next = [...chosen];
      for (const file of files) {
        const problem = checkChosenFile(file);
        if (problem) {
          messages.push(problem);
          continue;
        }
        if (next.some((c) => c.key === keyOf(file))) continue;
        if (next.length >= MAX_PHOTOS_PER_UPLOAD) {
          messages.push(
            `Up to ${MAX_PHOTOS_PER_UPLOAD} photos go at a time, so “${file.name}” and any after it were left out. Send them next.`,
          );
          break;
        }
        next.push({ key: keyOf(file), file });
      }
      setChosen(next);
      setNotices(messages);
    },
    [chosen],
  );

  const remove = useCallback((key: string) => setChosen((list) => list.filter((c) => c.key !== key)), []);

  const clear = useCallback(() => {
    setChosen([]);
    setNotices([]);
  }, []);

  return { chosen, notices, add, remove, clear };
}
