// The local-folder driver: each object is a file, written to a temporary file in
// the same folder, flushed, and renamed into place (a rename is atomic within one
// file system), so a crash never leaves half a photograph under its real name.
import { randomUUID } from 'node:crypto'
import { mkdir, open, readFile, rename, rm } from 'node:fs/promises'
import { join } from 'node:path'
import type { PhotoStorage } from './photo-storage'

/** Only plain names (no folders, no dot-files): every path join goes through this. */
function pathIn(dir: string, name: string): string {
  if (!/^[\w-][\w.-]*$/.test(name) || name.includes('..')) throw new Error('Not a storage name.')
  return join(dir, name)
}

export function localPhotoStorage(dir: string): PhotoStorage {
  return {
    kind: 'local',
    async put(name, bytes) {
      const target = pathIn(dir, name)
      await mkdir(dir, { recursive: true, mode: 0o700 })
      const temp = join(dir, `.upload-${randomUUID()}.tmp`)
      try {
        const handle = await open(temp, 'wx', 0o600)
        try {
          await handle.writeFile(bytes)
          await handle.sync()
        }
        finally {
          await handle.close()
        }
        await rename(temp, target)
      }
      catch (error) {
        await rm(temp, { force: true }).catch(() => {})
        throw error
      }
    },
    async get(name) {
      return readFile(pathIn(dir, name)).catch((error: NodeJS.ErrnoException) => {
        if (error.code === 'ENOENT') return null
        throw error
      })
    },
    async remove(name) {
      await rm(pathIn(dir, name), { force: true })
    },
  }
}
