import { LEARNING_BLOCK_SIZE, type LearningBlock } from '#shared/schemas/learning'

const mean = (values: readonly number[]) => values.reduce((a, b) => a + b, 0) / values.length

/** Mean |difference| by blocks of consecutive cases, oldest first; the last block may hold fewer. */
export function learningCurve(differences: readonly number[], size = LEARNING_BLOCK_SIZE): LearningBlock[] {
  const blocks: LearningBlock[] = []
  for (let start = 0; start < differences.length; start += size) {
    const block = differences.slice(start, start + size)
    blocks.push({
      block: blocks.length + 1,
      fromCase: start + 1,
      toCase: start + block.length,
      n: block.length,
      meanAbsDifferenceCmH2O: mean(block.map(Math.abs)),
    })
  }
  return blocks
}

/** Bias (mean difference) and mean |difference|; null without any pair. */
export function differenceFigures(differences: readonly number[]) {
  if (!differences.length) return { n: 0, bias: null, meanAbsDifference: null }
  return { n: differences.length, bias: mean(differences), meanAbsDifference: mean(differences.map(Math.abs)) }
}
