export { makeSignature } from '../../shared/signature'
