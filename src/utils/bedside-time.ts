/** An ISO time as the value of a `datetime-local` input, in the device's time zone. */
export function toLocalInput(iso: string | undefined): string {
  const date = new Date(iso ?? '')
  if (Number.isNaN(date.getTime())) return ''
  return new Date(date.getTime() - date.getTimezoneOffset() * 60_000).toISOString().slice(0, 16)
}

/** A `datetime-local` value back to ISO 8601 (UTC); empty when it is not a time. */
export function fromLocalInput(value: string): string {
  const date = new Date(value)
  return value && !Number.isNaN(date.getTime()) ? date.toISOString() : ''
}
