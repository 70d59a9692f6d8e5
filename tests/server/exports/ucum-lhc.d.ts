// The part of NLM's UCUM library (CommonJS, untyped) the export tests use; https://lhncbc.github.io/ucum-lhc/
declare module '@lhncbc/ucum-lhc' {
  interface ConvertResult {
    status: 'succeeded' | 'failed' | 'error'
    toVal: number | null
    msg: string[]
  }
  interface ValidateResult {
    status: 'valid' | 'invalid' | 'error'
    ucumCode: string | null
    msg: string[]
  }
  export const UcumLhcUtils: {
    getInstance(): {
      convertUnitTo(fromUnitCode: string, fromVal: number, toUnitCode: string): ConvertResult
      validateUnitString(unitString: string): ValidateResult
    }
  }
}
