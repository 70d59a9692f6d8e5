// The part of NLM's UCUM library (CommonJS, untyped) the unit tests use; https://lhncbc.github.io/ucum-lhc/
declare module '@lhncbc/ucum-lhc' {
  interface ConvertResult {
    status: 'succeeded' | 'failed' | 'error'
    toVal: number | null
    msg: string[]
  }
  export const UcumLhcUtils: {
    getInstance(): { convertUnitTo(fromUnitCode: string, fromVal: number, toUnitCode: string): ConvertResult }
  }
}
