// The object store and the mail catcher beside the app or a test run, unless external ones are
// configured (lib/object-store.mjs, lib/mail-catcher.mjs), and the environment that points the app at them.
import { externalSmtp, startMailCatcher } from './mail-catcher.mjs'
import { externalObjectStore, startObjectStore } from './object-store.mjs'

function services(store, mail) {
  return {
    env: { ...store?.env, ...mail?.env },
    stop: () => {
      mail?.stop()
      store?.stop()
    },
    /** The app's environment: this process's, the services', the database and the demo seed. */
    appEnv: (databaseUrl, extra = {}) => ({
      ...process.env,
      ...store?.env,
      ...mail?.env,
      DATABASE_URL: databaseUrl,
      PASTLOAD_SEED: process.env.PASTLOAD_SEED ?? 'demo',
      ...extra,
      NUXT_TELEMETRY_DISABLED: '1',
    }),
  }
}

/** For `npm run dev` and `npm start`: the fixed development ports; the app runs on without either. */
export async function startAppServices(root) {
  const store = externalObjectStore() ? null : await startObjectStore({ projectRoot: root, name: 's3', port: Number(process.env.PASTLOAD_S3_PORT ?? 54331), optional: true })
  const mail = externalSmtp() ? null : await startMailCatcher({ projectRoot: root, name: 'mail', port: Number(process.env.PASTLOAD_SMTP_PORT ?? 54332), webPort: Number(process.env.PASTLOAD_MAIL_WEB_PORT ?? 54333), optional: true })
  return services(store, mail)
}

/** For a test run: fresh ones of this process, on free ports unless PASTLOAD_TEST_S3_PORT / PASTLOAD_TEST_SMTP_PORT say. */
export async function startTestServices(root) {
  const store = externalObjectStore() ? null : await startObjectStore({ projectRoot: root, name: `s3-test-${process.pid}`, port: Number(process.env.PASTLOAD_TEST_S3_PORT ?? 0), fresh: true })
  try {
    const mail = externalSmtp() ? null : await startMailCatcher({ projectRoot: root, name: `mail-test-${process.pid}`, port: Number(process.env.PASTLOAD_TEST_SMTP_PORT ?? 0), webPort: 0, fresh: true })
    return services(store, mail)
  }
  catch (err) {
    store?.stop()
    throw err
  }
}
