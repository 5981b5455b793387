import { createRouter, createWebHistory, type RouterHistory, type Router } from 'vue-router';
import { useAuthStore } from '@/stores/auth';
import { decideAccess } from './access';
import { routes } from './routes';

/** Builds the router with its guards; tests pass a memory history. */
export function createAppRouter(history: RouterHistory = createWebHistory(import.meta.env.BASE_URL)): Router {
  const router = createRouter({
    history,
    routes,
    scrollBehavior: (_to, _from, savedPosition) => savedPosition ?? { top: 0 },
  });

  router.beforeEach(async (to) => {
    const auth = useAuthStore();
    // A reload keeps the token but not the user; ask the server who it belongs to first.
    if (auth.token && !auth.user) await auth.fetchMe();
    return decideAccess(to, { isAuthenticated: auth.isAuthenticated, role: auth.role });
  });

  router.afterEach((to) => {
    document.title = to.meta.title ? `${to.meta.title} · Cardloop` : 'Cardloop';
  });

  return router;
}
