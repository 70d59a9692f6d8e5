import { z } from 'zod'
import { FeedbackCodeSchema } from './signature.ts'

/** Cases per point of the learning curve. */
export const LEARNING_BLOCK_SIZE = 10

/** One block of the learning curve: cases `fromCase`–`toCase` (1-based, oldest first) and their mean |difference|. */
export const LearningBlockSchema = z.object({
  block: z.number().int().min(1),
  fromCase: z.number().int().min(1),
  toCase: z.number().int().min(1),
  n: z.number().int(),
  meanAbsDifferenceCmH2O: z.number(),
})
export type LearningBlock = z.infer<typeof LearningBlockSchema>

/** Feedback an attending gave with a countersignature of one of the resident's exams. */
export const FeedbackReceivedSchema = z.object({
  examId: z.string(),
  patientCode: z.string(),
  signerName: z.string(),
  signedAt: z.string(),
  codes: z.array(FeedbackCodeSchema),
  text: z.string().nullable(),
  differenceCmH2O: z.number().nullable(),
})
export type FeedbackReceived = z.infer<typeof FeedbackReceivedSchema>

/**
 * `GET /api/agreement/mine` (a resident: their own; `?residentId=` an attending, for a resident of their teams):
 * the resident's point pairs, difference = the resident's estimate − the partner's (cmH₂O), oldest first.
 */
export const MyAgreementQuerySchema = z.object({ residentId: z.string().min(1).max(100).optional() })
export type MyAgreementQuery = z.infer<typeof MyAgreementQuerySchema>

export const MyAgreementSchema = z.object({
  residentId: z.string(),
  name: z.string(),
  n: z.number().int(),
  bias: z.number().nullable(),
  meanAbsDifference: z.number().nullable(),
  curve: z.array(LearningBlockSchema),
  feedback: z.array(FeedbackReceivedSchema),
  caution: z.string(),
})
export type MyAgreement = z.infer<typeof MyAgreementSchema>
