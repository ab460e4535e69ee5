import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';

/** Opens the hosted payment page: the browser leaves for it, so nothing is cached here. */
function goTo({ url }: { url: string }) {
  window.location.assign(url);
}

export const startSwapCheckout = (swapId: number, kinds?: ('entry' | 'postage')[]) =>
  api.post<{ url: string }>(`/swaps/${swapId}/checkout`, kinds ? { kinds } : {});
export const startDuesCheckout = (guildId: number) => api.post<{ url: string }>(`/guilds/${guildId}/dues/checkout`, {});

export const useSwapCheckout = (swapId: number) =>
  useMutation({ mutationFn: (kinds?: ('entry' | 'postage')[]) => startSwapCheckout(swapId, kinds), onSuccess: goTo });
export const useDuesCheckout = (guildId: number) =>
  useMutation({ mutationFn: () => startDuesCheckout(guildId), onSuccess: goTo });
