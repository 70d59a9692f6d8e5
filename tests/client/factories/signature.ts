export { makeSignature } from '../../../tests/shared/signature'
