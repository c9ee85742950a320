// PrimeVue components resolved on demand by unplugin-vue-components (vite.config.ts), typed for vue-tsc.
// Same file name and shape as the plugin's own `dts` output, so turning that option on can replace this list.
export {}

declare module 'vue' {
  export interface GlobalComponents {
    Button: (typeof import('primevue/button'))['default']
    InputText: (typeof import('primevue/inputtext'))['default']
    Message: (typeof import('primevue/message'))['default']
    Password: (typeof import('primevue/password'))['default']
    Skeleton: (typeof import('primevue/skeleton'))['default']
  }
}
