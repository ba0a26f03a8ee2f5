/** The client's screens. Every view is loaded lazily; guards in ./guards decide access. */
import { createRouter, createWebHistory, type RouteRecordRaw, type Router, type RouterHistory } from 'vue-router';
import { installGuards } from './guards';

export const routes: RouteRecordRaw[] = [
  { path: '/', redirect: { name: 'projects' } },
  {
    path: '/sign-in',
    name: 'sign-in',
    component: () => import('@/views/SignInView.vue'),
    meta: { public: true, title: 'Sign in' },
  },
  {
    path: '/change-password',
    name: 'change-password',
    component: () => import('@/views/ChangePasswordView.vue'),
    meta: { title: 'Change password' },
  },
  {
    path: '/projects',
    name: 'projects',
    component: () => import('@/views/ProjectsView.vue'),
    meta: { title: 'Projects' },
  },
  {
    path: '/projects/:projectId(\\d+)',
    name: 'project',
    component: () => import('@/views/ProjectView.vue'),
    props: (route) => ({ projectId: Number(route.params.projectId) }),
    meta: { title: 'Project' },
  },
  {
    path: '/projects/:projectId(\\d+)/decks/new',
    name: 'deck-new',
    component: () => import('@/views/DeckWorkspaceView.vue'),
    props: (route) => ({ projectId: Number(route.params.projectId), fromStudy: route.query.study ? Number(route.query.study) : undefined, fromPoint: route.query.point ? Number(route.query.point) : undefined }),
    meta: { title: 'New deck', roles: ['admin', 'designer', 'instructor'] },
  },
  {
    path: '/decks/:deckId(\\d+)',
    name: 'deck',
    component: () => import('@/views/DeckWorkspaceView.vue'),
    props: (route) => ({ deckId: Number(route.params.deckId) }),
    meta: { title: 'Deck' },
  },
  {
    path: '/decks/:deckId(\\d+)/versions/:versionNumber(\\d+)',
    name: 'deck-version',
    component: () => import('@/views/DeckWorkspaceView.vue'),
    props: (route) => ({ deckId: Number(route.params.deckId), versionNumber: Number(route.params.versionNumber) }),
    meta: { title: 'Deck version' },
  },
  // Review, training and mail screens.
  {
    path: '/reviews',
    name: 'reviews',
    component: () => import('@/views/ReviewsView.vue'),
    meta: { title: 'Reviews', roles: ['admin', 'designer', 'reviewer', 'instructor'] },
  },
  {
    path: '/reviews/new',
    name: 'review-submit',
    component: () => import('@/views/ReviewSubmitView.vue'),
    meta: { title: 'Submit for review', roles: ['admin', 'designer'] },
  },
  {
    path: '/reviews/:reviewId(\\d+)',
    name: 'review',
    component: () => import('@/views/ReviewView.vue'),
    props: (route) => ({ reviewId: Number(route.params.reviewId) }),
    meta: { title: 'Review', roles: ['admin', 'designer', 'reviewer', 'instructor'] },
  },
  {
    path: '/projects/:projectId(\\d+)/files',
    name: 'project-files',
    component: () => import('@/views/ProjectFilesView.vue'),
    props: (route) => ({ projectId: Number(route.params.projectId) }),
    meta: { title: 'Drawings and imports' },
  },
  {
    path: '/training',
    name: 'training',
    component: () => import('@/views/TrainingView.vue'),
    meta: { title: 'Training', roles: ['instructor', 'trainee'] },
  },
  {
    path: '/training/new',
    name: 'training-new',
    component: () => import('@/views/TrainingNewView.vue'),
    meta: { title: 'New exercise', roles: ['instructor'] },
  },
  {
    path: '/training/:exerciseId(\\d+)',
    name: 'training-exercise',
    component: () => import('@/views/TrainingExerciseView.vue'),
    props: (route) => ({ exerciseId: Number(route.params.exerciseId) }),
    meta: { title: 'Exercise', roles: ['instructor', 'trainee'] },
  },
  {
    path: '/mail',
    name: 'mail',
    component: () => import('@/views/OutboxView.vue'),
    meta: { title: 'Mail', roles: ['admin'] },
  },
  {
    path: '/set-password/:token',
    name: 'set-password',
    component: () => import('@/views/SetPasswordView.vue'),
    props: (route) => ({ token: String(route.params.token) }),
    meta: { public: true, title: 'Choose your password' },
  },
  {
    path: '/admin/users',
    name: 'admin-users',
    component: () => import('@/views/AdminUsersView.vue'),
    meta: { title: 'Users', roles: ['admin'] },
  },
  {
    path: '/studies/:studyId(\\d+)',
    name: 'study',
    component: () => import('@/views/StudyView.vue'),
    props: (route) => ({ studyId: Number(route.params.studyId) }),
    meta: { title: 'Study', roles: ['admin', 'designer', 'reviewer', 'instructor'] },
  },
  {
    path: '/not-allowed',
    name: 'not-allowed',
    component: () => import('@/views/NotAllowedView.vue'),
    meta: { title: 'Not allowed' },
  },
  {
    path: '/:pathMatch(.*)*',
    name: 'not-found',
    component: () => import('@/views/NotFoundView.vue'),
    meta: { title: 'Not found' },
  },
];

export function createAppRouter(history: RouterHistory = createWebHistory()): Router {
  const router = createRouter({ history, routes });
  installGuards(router);
  return router;
}
