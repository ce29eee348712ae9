import fsDriver from 'unstorage/drivers/fs'

// Photo bytes go to the `uploads` storage: a local folder by default. Production points this
// at an S3-compatible bucket by mounting another unstorage driver here from configuration.
export default defineNitroPlugin(() => {
  const { uploadsDir } = useRuntimeConfig()
  useStorage().mount('uploads', fsDriver({ base: uploadsDir }))
})
