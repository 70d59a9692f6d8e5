import './node-file-apis'
import { afterAll, afterEach, beforeAll, beforeEach, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount, type VueWrapper } from '@vue/test-utils'
import { createPinia, setActivePinia, type Pinia } from 'pinia'
import { createVuetify } from 'vuetify'
import request from 'supertest'
import type { User } from '#shared/schemas/user'
import { db } from '@/db'
import AttachmentPicker from '@/components/attachments/AttachmentPicker.vue'
import { useSessionStore } from '@/stores/session'
import { useSyncStore } from '@/stores/sync'
import { recordExam } from '../../server/factories/exam.ts'
import { allowPhotos, makePhoto, upload } from '../../server/attachments/photos.ts'
import { makeAccount } from '../stores/sync-server'
import { photoFile, startAttachmentServer } from './attachment-server'

let server: Awaited<ReturnType<typeof startAttachmentServer>>
let pinia: Pinia
let wrapper: VueWrapper | undefined
const created: string[] = []
const revoked: string[] = []

beforeAll(async () => {
  server = await startAttachmentServer()
  // jsdom has no object URLs; these record what the component asks of the browser.
  URL.createObjectURL = vi.fn(() => {
    const url = `blob:test/${created.length + 1}`
    created.push(url)
    return url
  })
  URL.revokeObjectURL = vi.fn((url: string) => void revoked.push(url))
})

afterAll(async () => {
  await server.close()
})

function signInAs(account: { user: User; token: string }) {
  Object.assign(useSessionStore(), { user: account.user, token: account.token })
}

async function mountPicker(examId: string, editable = true) {
  wrapper = mount(AttachmentPicker, { props: { examId, editable }, global: { plugins: [createVuetify(), pinia] }, attachTo: document.body })
  await flushPromises()
  return wrapper
}

/** Hands files to the hidden input, as the phone's camera or file chooser does. */
async function choose(w: VueWrapper, files: File[]) {
  const input = w.find('[data-testid="attachment-file-input"]')
  Object.defineProperty(input.element, 'files', { value: files, configurable: true })
  await input.trigger('change')
  await flushPromises()
}

const button = (w: VueWrapper, id: string) => w.find(`[data-testid="${id}"]`)

describe('AttachmentPicker', () => {
  beforeEach(async () => {
    pinia = createPinia()
    setActivePinia(pinia)
    await db.attachments.clear()
    await allowPhotos(true)
    created.length = 0
    revoked.length = 0
  })

  afterEach(() => {
    wrapper?.unmount()
    wrapper = undefined
    useSyncStore().stop()
    document.body.innerHTML = ''
  })

  it('asks for the consent before any photo can be taken or chosen', async () => {
    const account = await makeAccount()
    signInAs(account)
    const w = await mountPicker(crypto.randomUUID())

    expect(button(w, 'attachment-take').attributes('disabled')).toBeDefined()
    expect(button(w, 'attachment-choose').attributes('disabled')).toBeDefined()
    expect(button(w, 'attachment-hint').text()).toBe('Tick the consent first to add photos.')
    expect(w.find('[data-testid="attachment-camera-input"]').attributes()).toMatchObject({ accept: 'image/jpeg,image/png,image/webp', capture: 'environment' })

    await w.find('[data-testid="attachment-consent"] input').setValue(true)

    expect(button(w, 'attachment-take').attributes('disabled')).toBeUndefined()
    expect(button(w, 'attachment-choose').attributes('disabled')).toBeUndefined()
    expect(button(w, 'attachment-hint').text()).toBe('4 more photos can be added.')
  })

  it('keeps chosen photos on the device with a thumbnail, and says why a file was left out', async () => {
    const account = await makeAccount()
    signInAs(account)
    const examId = crypto.randomUUID()
    const w = await mountPicker(examId)
    await w.find('[data-testid="attachment-consent"] input').setValue(true)

    await choose(w, [photoFile(await makePhoto('jpeg'), 'neck.jpg'), photoFile(Buffer.alloc(5 * 1024 * 1024 + 1), 'huge.jpg')])

    await vi.waitFor(() => expect(w.findAll('[data-testid="attachment-local"]')).toHaveLength(1), { timeout: 15_000 })
    expect(w.find('[data-testid="attachment-local"]').text()).toContain('neck.jpg')
    expect(w.find('[data-testid="attachment-local"] img').attributes('src')).toMatch(/^blob:test\//)
    expect(w.find('[data-testid="attachment-problem"]').text()).toContain('“huge.jpg” is over 5 MB')
    expect(await db.attachments.where('examId').equals(examId).toArray()).toMatchObject([{ name: 'neck.jpg', state: 'pending', consent: true }])
    expect(button(w, 'attachment-hint').text()).toBe('3 more photos can be added.')
  })

  it('removing a photo kept on the device deletes it there', async () => {
    const account = await makeAccount()
    signInAs(account)
    const examId = crypto.randomUUID()
    const w = await mountPicker(examId)
    await w.find('[data-testid="attachment-consent"] input').setValue(true)
    await choose(w, [photoFile(await makePhoto('png'), 'bed.png', 'image/png')])
    await vi.waitFor(() => expect(w.findAll('[data-testid="attachment-local"]')).toHaveLength(1), { timeout: 15_000 })

    await button(w, 'attachment-remove-local').trigger('click')

    await vi.waitFor(() => expect(w.findAll('[data-testid="attachment-local"]')).toHaveLength(0), { timeout: 15_000 })
    expect(await db.attachments.count()).toBe(0)
    expect(revoked).toEqual(created)
  })

  it('shows the photos stored on the server, fetched with the token, and revokes their object URLs when it goes away', async () => {
    const account = await makeAccount()
    const auth = `Bearer ${account.token}`
    const exam = await recordExam(server.app, auth, { teamId: account.user.teams[0]!.id })
    await upload(server.app, auth, exam.id, await makePhoto('webp'), { filename: 'ruler.webp', contentType: 'image/webp' }).expect(201)
    signInAs(account)
    const w = await mountPicker(exam.id, false)

    await vi.waitFor(() => expect(w.find('[data-testid="attachment-stored"] img').exists()).toBe(true), { timeout: 15_000 })
    expect(w.find('[data-testid="attachment-stored"]').text()).toContain('ruler.webp')
    // Read-only: no consent, no adding, no removing.
    expect(w.find('[data-testid="attachment-consent"]').exists()).toBe(false)
    expect(w.find('[data-testid="attachment-remove-stored"]').exists()).toBe(false)
    expect(created).toHaveLength(1)

    w.unmount()
    wrapper = undefined

    expect(revoked).toEqual(created)
  })

  it('lets the author remove a stored photo of an editable exam', async () => {
    const account = await makeAccount()
    const auth = `Bearer ${account.token}`
    const exam = await recordExam(server.app, auth, { teamId: account.user.teams[0]!.id })
    await upload(server.app, auth, exam.id, await makePhoto('jpeg')).expect(201)
    signInAs(account)
    const w = await mountPicker(exam.id)
    await vi.waitFor(() => expect(w.findAll('[data-testid="attachment-stored"]')).toHaveLength(1), { timeout: 15_000 })

    await button(w, 'attachment-remove-stored').trigger('click')

    await vi.waitFor(() => expect(w.findAll('[data-testid="attachment-stored"]')).toHaveLength(0), { timeout: 15_000 })
    const list = await request(server.app).get(`/api/exams/${exam.id}/attachments`).set('Authorization', auth)
    expect(list.body.attachments).toEqual([])
  })

  it('says photos are switched off when the hospital does not allow them, and offers no way to add one', async () => {
    const account = await makeAccount()
    signInAs(account)
    await allowPhotos(false)

    const w = await mountPicker(crypto.randomUUID())

    await vi.waitFor(() => expect(w.find('[data-testid="attachment-disabled"]').exists()).toBe(true), { timeout: 15_000 })
    expect(w.find('[data-testid="attachment-consent"]').exists()).toBe(false)
    expect(w.find('[data-testid="attachment-take"]').exists()).toBe(false)
  })
})
