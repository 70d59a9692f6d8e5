import { createRouter, createWebHistory } from 'vue-router'
import { accessGuard } from './guard'
import { routes } from './routes'

const router = createRouter({ history: createWebHistory(import.meta.env.BASE_URL), routes })

router.beforeEach(accessGuard)
router.afterEach((to) => {
  document.title = to.meta.title ? `${to.meta.title} · Plumbline` : 'Plumbline'
})

export default router
