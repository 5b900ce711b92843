// Mounts the uploads store from runtime config, so one build can keep photos on local disk or
// in an S3-compatible bucket (NUXT_UPLOADS_DRIVER=s3 and NUXT_UPLOADS_S3_*).
import path from 'node:path'
import fsDriver from 'unstorage/drivers/fs-lite'
import s3Driver from 'unstorage/drivers/s3'

export default defineNitroPlugin(() => {
  const { uploads } = useRuntimeConfig()
  const storage = useStorage()
  if (uploads.driver === 's3') {
    const s3 = uploads.s3
    for (const key of ['endpoint', 'region', 'bucket', 'accessKeyId', 'secretAccessKey'] as const) {
      if (!s3[key]) throw new Error(`Uploads go to S3 but NUXT_UPLOADS_S3_${key.replace(/[A-Z]/g, (c) => `_${c}`).toUpperCase()} is not set.`)
    }
    storage.mount('uploads', s3Driver({ ...s3 }))
  } else {
    storage.mount('uploads', fsDriver({ base: path.resolve(uploads.dir || '.data/uploads') }))
  }
})
