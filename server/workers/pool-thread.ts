/**
 * What every thread of a task pool runs (see task-pool.ts). The pool's job module is loaded while the
 * thread starts, before it takes work, and each task tells the pool the moment it begins: the pool's
 * time limit then counts the work, not the wait in the queue or a new thread's start-up.
 */
import { workerData, type MessagePort } from 'node:worker_threads'

/** What the pool posts for one task. */
export interface TaskMessage {
  /** an export of the job module */
  name: string
  input: unknown
  /** told once, when the task begins */
  started: MessagePort
}

/** What the pool hands each thread when it starts. */
export interface ThreadData {
  /** address of the job module: its exports are the tasks */
  job: string
}

const { job } = workerData as ThreadData
const tasks = (await import(job)) as Record<string, unknown>

/**
 * Piscina calls this, by the file's path, for every task of the pool.
 * @public
 */
export default function runTask({ name, input, started }: TaskMessage): unknown {
  const task = tasks[name]
  started.postMessage(null)
  started.close()
  if (typeof task !== 'function') throw new Error(`The job ${job} has no task named ${name}`)
  return task(input)
}
