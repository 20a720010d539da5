import { createRouter, createWebHistory, type RouteLocationNormalized } from 'vue-router'
import { dayPlanQuery, lakeReadQuery } from '@/api/lakes'
import { settingsQuery } from '@/api/settings'
import { queryClient } from '@/queryClient'
import type { Role } from '@shared/schemas/auth'
import { useAuthStore } from '@/stores/auth'
import { loadNaiveScope } from '@/components/naiveScope'
import LakeReadView from '@/views/LakeReadView.vue'

declare module 'vue-router' {
  interface RouteMeta {
    /** The least role that may open the page; absent for public pages. */
    role?: Role
    /** Pages for signed-out visitors only (sign in, sign up). */
    guestOnly?: boolean
    title?: string
    /**
     * The page is plain markup, not naive-ui, so it draws without waiting for the component
     * library; any naive-ui parts inside it wrap themselves in NaiveScope.
     */
    plain?: boolean
    /** Starts the page's data as navigation begins, alongside its code, not after it mounts. */
    prefetch?: (to: RouteLocationNormalized) => void
  }
}

const router = createRouter({
  history: createWebHistory(),
  routes: [
    {
      path: '/',
      name: 'home',
      component: () => import('@/views/HomeView.vue'),
      meta: { title: 'Chopline' },
    },
    {
      path: '/signin',
      name: 'signin',
      component: () => import('@/views/SignInView.vue'),
      meta: { guestOnly: true, title: 'Sign in' },
    },
    {
      path: '/signup',
      name: 'signup',
      component: () => import('@/views/SignUpView.vue'),
      meta: { guestOnly: true, title: 'Create an account' },
    },
    {
      path: '/lakes',
      name: 'lakes',
      component: () => import('@/views/LakesView.vue'),
      meta: { role: 'angler', title: 'Lakes' },
    },
    {
      path: '/lakes/:slug',
      name: 'lake-read',
      // In the first bundle, not a chunk of its own: it is the page most visits open, and served
      // with its data (see PageBoot) it then renders in the same task as the app, before a paint.
      component: LakeReadView,
      meta: {
        role: 'angler',
        title: 'Lake read',
        plain: true,
        prefetch: (to) => void queryClient.prefetchQuery(lakeReadQuery(String(to.params.slug))),
      },
    },
    {
      path: '/lakes/:slug/plan/:date',
      name: 'day-plan',
      component: () => import('@/views/DayPlanView.vue'),
      meta: {
        role: 'angler',
        title: 'Day plan',
        prefetch: (to) =>
          void queryClient.prefetchQuery(
            dayPlanQuery(String(to.params.slug), String(to.params.date)),
          ),
      },
    },
    {
      path: '/settings',
      name: 'settings',
      component: () => import('@/views/SettingsView.vue'),
      meta: { role: 'angler', title: 'Settings' },
    },
    {
      path: '/journal',
      name: 'journal',
      component: () => import('@/views/JournalView.vue'),
      meta: { role: 'angler', title: 'Catch journal' },
    },
    {
      path: '/journal/insights',
      name: 'journal-insights',
      component: () => import('@/views/JournalInsightsView.vue'),
      meta: { role: 'angler', title: 'Insights' },
    },
    {
      path: '/journal/:id',
      name: 'catch',
      component: () => import('@/views/CatchEntryView.vue'),
      meta: { role: 'angler', title: 'Catch' },
    },
    {
      path: '/admin/users',
      name: 'admin-users',
      component: () => import('@/views/AdminUsersView.vue'),
      meta: { role: 'admin', title: 'Users' },
    },
    {
      path: '/welcome',
      name: 'welcome',
      component: () => import('@/views/MailLinkView.vue'),
      props: { action: 'welcome' },
      meta: { title: 'Finish your account' },
    },
    {
      path: '/verify-email',
      name: 'verify-email',
      component: () => import('@/views/MailLinkView.vue'),
      props: { action: 'verify' },
      meta: { title: 'Confirm your address' },
    },
    {
      path: '/unsubscribe',
      name: 'unsubscribe',
      component: () => import('@/views/MailLinkView.vue'),
      props: { action: 'unsubscribe' },
      meta: { title: 'Unsubscribe' },
    },
    {
      path: '/watch/stop',
      name: 'watch-stop',
      component: () => import('@/views/WatchStopView.vue'),
      meta: { title: 'Stop a watch' },
    },
    {
      path: '/watches',
      name: 'watches',
      component: () => import('@/views/WatchesView.vue'),
      // "Watch this bank": a new watch starts on `?lake=slug&bank=id`.
      props: (route) => ({ lake: route.query.lake, bank: route.query.bank }),
      meta: { role: 'angler', title: 'Watches' },
    },
    {
      path: '/guide/clients',
      name: 'guide-clients',
      component: () => import('@/views/GuideClientsView.vue'),
      meta: { role: 'guide', title: 'Clients' },
    },
    {
      path: '/guide/trips',
      name: 'guide-trips',
      component: () => import('@/views/GuideTripsView.vue'),
      meta: { role: 'guide', title: 'Trips' },
    },
    {
      path: '/guide/trips/:id',
      name: 'guide-trip',
      component: () => import('@/views/GuideTripView.vue'),
      meta: { role: 'guide', title: 'Trip' },
    },
    {
      path: '/trip/:token',
      name: 'shared-trip',
      component: () => import('@/views/SharedTripView.vue'),
      meta: { title: 'Your trip' },
    },
    {
      path: '/admin/stations',
      name: 'admin-stations',
      component: () => import('@/views/AdminStationsView.vue'),
      meta: { role: 'admin', title: 'Stations' },
    },
    {
      path: '/admin/lakes',
      name: 'admin-lakes',
      component: () => import('@/views/AdminLakesView.vue'),
      meta: { role: 'admin', title: 'Lakes (desk)' },
    },
    {
      path: '/admin/quarantine',
      name: 'admin-quarantine',
      component: () => import('@/views/AdminQuarantineView.vue'),
      meta: { role: 'admin', title: 'Quarantine' },
    },
    {
      path: '/admin/audit',
      name: 'admin-audit',
      component: () => import('@/views/AdminAuditView.vue'),
      meta: { role: 'admin', title: 'Audit log' },
    },
    {
      path: '/admin/mail',
      name: 'admin-mail',
      component: () => import('@/views/AdminMailView.vue'),
      meta: { role: 'admin', title: 'Mail' },
    },
    {
      path: '/:pathMatch(.*)*',
      name: 'not-found',
      component: () => import('@/views/NotFoundView.vue'),
      meta: { title: 'Not found' },
    },
  ],
})

router.beforeEach(async (to) => {
  to.meta.prefetch?.(to)
  if (!to.meta.plain) void loadNaiveScope()
  const auth = useAuthStore()
  // Signed-in pages show numbers in the user's units: ask for them beside the sign-in check.
  if (to.meta.role && (auth.signedIn || !auth.checked))
    void queryClient.prefetchQuery(settingsQuery)
  if (!auth.checked) await auth.load().catch(() => undefined)
  if (to.meta.guestOnly && auth.signedIn) return { name: 'lakes' }
  if (!to.meta.role) return true
  if (!auth.signedIn) return { name: 'signin', query: { redirect: to.fullPath } }
  if (!auth.can(to.meta.role))
    return { name: 'not-found', params: { pathMatch: to.path.slice(1).split('/') } }
  return true
})

router.afterEach((to) => {
  document.title =
    to.meta.title && to.meta.title !== 'Chopline' ? `${to.meta.title} · Chopline` : 'Chopline'
})

export default router
