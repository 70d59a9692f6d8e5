import type { AddressInfo } from 'node:net'
import type { Server } from 'node:http'
import { afterAll, afterEach, beforeAll, describe, expect, it, vi } from 'vitest'
import { flushPromises, mount } from '@vue/test-utils'
import Papa from 'papaparse'
import request from 'supertest'
import { createVuetify } from 'vuetify'
import { CAUTION_TEXT } from '#shared/domain/interpretation'
import type { Sequelize } from 'sequelize'
import ExamExportMenu from '@/components/exam/ExamExportMenu.vue'
import { configureApiBase } from '@/api/client'
import { accessToken } from '@/api/token'
import { makeExamInput } from '../../../server/factories/exam.ts'
import { makeCaller, makeTeam, makeTestApp } from '../../../server/helpers.ts'

let server: Server
let sequelize: Sequelize
let app: Awaited<ReturnType<typeof makeTestApp>>['app']

// The real API on in-memory SQLite, on a loopback port, with the client's `api` pointed at it.
beforeAll(async () => {
  ;({ app, sequelize } = await makeTestApp())
  server = app.listen(0, '127.0.0.1')
  await new Promise<void>((resolve) => server.once('listening', () => resolve()))
  configureApiBase(`http://127.0.0.1:${(server.address() as AddressInfo).port}/api/`, { timeout: 10_000 })
})

afterAll(async () => {
  server.closeAllConnections()
  await new Promise((resolve) => server.close(resolve))
  await sequelize.close()
})

/** What the browser was handed to save: jsdom has no object URLs, so the test catches the Blob there. */
function catchDownloads() {
  const saved: { blob: Blob; filename: string }[] = []
  let pending: Blob | null = null
  URL.createObjectURL = vi.fn((blob: Blob) => {
    pending = blob
    return 'blob:test'
  })
  URL.revokeObjectURL = vi.fn()
  vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (this: HTMLAnchorElement) {
    saved.push({ blob: pending!, filename: this.download })
  })
  return saved
}

async function residentWithExams(patientCodes: string[]) {
  const team = await makeTeam()
  const resident = await makeCaller({ teamIds: [team.id] })
  const ids: string[] = []
  for (const patientCode of patientCodes) {
    const res = await request(app).post('/api/exams').set('Authorization', resident.auth).send(makeExamInput({ teamId: team.id, patientCode }))
    ids.push(res.body.id)
  }
  accessToken.value = resident.auth.slice('Bearer '.length)
  return { ids }
}

function mountMenu(props: InstanceType<typeof ExamExportMenu>['$props']) {
  return mount(ExamExportMenu, { props, global: { plugins: [createVuetify()] }, attachTo: document.body })
}

describe('ExamExportMenu', () => {
  afterEach(() => {
    vi.restoreAllMocks()
    document.body.innerHTML = ''
    accessToken.value = null
  })

  it('downloads the exam as a FHIR R4 Bundle with the bearer token and saves it as a .fhir.json file', async () => {
    const saved = catchDownloads()
    const { ids } = await residentWithExams(['SM-0142'])
    const wrapper = mountMenu({ examId: ids[0] })

    await wrapper.find('[data-testid="export-fhir"]').trigger('click')
    await vi.waitFor(() => expect(saved).toHaveLength(1), { timeout: 15_000 })

    expect(saved[0]!.filename).toBe(`plumbline-exam-${ids[0]}.fhir.json`)
    const bundle = JSON.parse(await saved[0]!.blob.text())
    expect(bundle).toMatchObject({ resourceType: 'Bundle', type: 'collection' })
    expect(bundle.entry[0].resource).toMatchObject({ resourceType: 'Observation', id: ids[0] })
    expect(bundle.entry[0].resource.note.map((n: { text: string }) => n.text)).toContain(CAUTION_TEXT)
    expect(wrapper.find('[data-testid="export-csv"]').exists()).toBe(false)
  })

  it('downloads the CSV of the given filters', async () => {
    const saved = catchDownloads()
    const { ids } = await residentWithExams(['SM-0201', 'SM-0202'])
    const wrapper = mountMenu({ filters: { patientCode: 'SM-0202' } })

    await wrapper.find('[data-testid="export-csv"]').trigger('click')
    await vi.waitFor(() => expect(saved).toHaveLength(1), { timeout: 15_000 })

    expect(saved[0]!.filename).toMatch(/^plumbline-exams-\d{4}-\d{2}-\d{2}\.csv$/)
    const rows = Papa.parse<Record<string, string>>(await saved[0]!.blob.text(), { header: true, skipEmptyLines: true }).data
    expect(rows.map((r) => r.exam_id)).toEqual([ids[1]])
    expect(rows[0]!.caution).toBe(CAUTION_TEXT)
  })

  it('shows the server’s refusal instead of saving anything', async () => {
    const saved = catchDownloads()
    await residentWithExams([])
    const wrapper = mountMenu({ examId: crypto.randomUUID() })

    await wrapper.find('[data-testid="export-fhir"]').trigger('click')
    await vi.waitFor(() => expect(wrapper.find('[data-testid="export-error"]').exists()).toBe(true), { timeout: 15_000 })
    await flushPromises()

    expect(wrapper.find('[data-testid="export-error"]').text()).toBe('No such exam')
    expect(saved).toEqual([])
  })
})
