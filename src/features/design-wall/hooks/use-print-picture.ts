import { useEffect, useState } from 'react';

/** Opens the print dialog once the wall's picture is ready to print. */
export function usePrintPicture(picture: () => Promise<HTMLCanvasElement>) {
  const [printUrl, setPrintUrl] = useState<string | null>(null);
  useEffect(() => {
    if (!printUrl) return;
    const t = setTimeout(() => window.print(), 100);
    return () => clearTimeout(t);
  }, [printUrl]);
  const print = async () => setPrintUrl((await picture()).toDataURL('image/png'));
  return { printUrl, print };
}
