// The names of the Monte Carlo kernels (its own small file, so the command line can list them without loading the
// kernels themselves).
export const KERNEL_CHOICES = ['auto', 'js', 'wasm'] as const;
export type KernelChoice = (typeof KERNEL_CHOICES)[number];
export type KernelName = 'js' | 'wasm';
