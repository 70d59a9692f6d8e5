/**
 * A new task: what comes after it is a task of its own, so the browser can take input and paint between the two.
 * https://web.dev/articles/optimize-long-tasks (yielding to the main thread)
 */
export const nextTask = () => new Promise<void>((resolve) => setTimeout(resolve))
