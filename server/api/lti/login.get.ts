// OIDC third-party initiated login (LTI Core 1.3 §4.1), by GET.
import { answerLogin } from '~~/server/lib/lti/flow'

export default defineEventHandler(async (event): Promise<string | void> => answerLogin(event, await useDb(), siteOrigin()))
