// Samples the configured port inputs on the time grid t_n = n·Δt, n = 0..nt, as complex envelopes (√W).
// The sampler lives in shared/ so the form's preview launches exactly what the solver launches.
export { pulseAmplitude, sampleInput } from '@shared/pulse-envelope'
