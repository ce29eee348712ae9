import fsDriver from 'unstorage/drivers/fs'
import s3Driver from 'unstorage/drivers/s3'

// Photo bytes go to the `uploads` storage: an S3-compatible bucket when NUXT_UPLOADS_S3_BUCKET is
// set (what several app servers share), else a local folder (one server, or development).
export default defineNitroPlugin(() => {
  const c = useRuntimeConfig()
  if (!c.uploadsS3Bucket) {
    useStorage().mount('uploads', fsDriver({ base: c.uploadsDir }))
    return
  }
  useStorage().mount('uploads', s3Driver({
    endpoint: c.uploadsS3Endpoint, bucket: c.uploadsS3Bucket, region: c.uploadsS3Region,
    accessKeyId: c.uploadsS3AccessKeyId, secretAccessKey: c.uploadsS3SecretAccessKey,
  }))
  console.log(`[storage] photos in the bucket ${c.uploadsS3Bucket} at ${c.uploadsS3Endpoint}`)
})
