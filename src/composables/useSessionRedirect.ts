import { watch } from 'vue';
import { useRoute, useRouter } from 'vue-router';
import { useAuthStore } from '@/stores/auth';

/**
 * Sends the user to sign-in the moment a session ends — by "Sign out" or by the server
 * rejecting the token — keeping the way back only when the session expired under them.
 */
export function useSessionRedirect(): void {
  const auth = useAuthStore();
  const route = useRoute();
  const router = useRouter();

  watch(
    () => auth.isAuthenticated,
    (signedIn, wasSignedIn) => {
      if (signedIn || !wasSignedIn || route.meta.public) return;
      const query = auth.sessionEnd === 'expired' ? { redirect: route.fullPath } : undefined;
      void router.replace({ name: 'login', query });
    },
  );
}
