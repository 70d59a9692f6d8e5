// The yardstick of `npm run bench:api`: bare Express answering one JSON page held in memory. Arg: <file>; sends its port.
import { readFileSync } from 'node:fs'
import type { AddressInfo } from 'node:net'
import express from 'express'

const [file] = process.argv.slice(2)
const body = readFileSync(file!, 'utf8')
const app = express()
app.get('/page', (_req, res) => res.type('application/json').send(body))
const server = app.listen(0, '127.0.0.1', () => process.send?.((server.address() as AddressInfo).port))
