import { answerLogin } from '~~/server/lib/lti/flow'

// OIDC third-party initiated login (LTI Core 1.3 §4.1), by a form POST from the platform.
export default defineEventHandler(async event => answerLogin(event, await useDb(), siteOrigin()))
