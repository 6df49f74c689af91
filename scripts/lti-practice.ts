// npm run lti:practice — the practice learning platform for development (never in the
// production build). Starts it on a loopback port, prints what to register in Cyclodial
// (Admin → Learning platforms) and where to click "Launch as a student / as a tutor".
//   LTI_PRACTICE_PORT (default 3999), LTI_TOOL_ORIGIN (default http://localhost:3000)
import { PracticePlatform } from '../tests/support/lti-platform'

const port = Number(process.env.LTI_PRACTICE_PORT ?? 3999)
const tool = (process.env.LTI_TOOL_ORIGIN ?? 'http://localhost:3000').replace(/\/+$/, '')
const platform = new PracticePlatform(tool)
await platform.start(port)
const r = platform.registration()
console.info(`Practice platform on ${platform.issuer} for the tool at ${tool}

Register it in Cyclodial (Admin → Learning platforms), or POST /api/admin/lti/platforms with:
${JSON.stringify(r, null, 2)}

Then open ${platform.issuer}/ and choose "Add Cyclodial content as a tutor", "Launch as a student" or "Launch as a tutor".
Stop with Ctrl+C.`)
process.on('SIGINT', () => platform.stop().then(() => process.exit(0)))
process.on('SIGTERM', () => platform.stop().then(() => process.exit(0)))
