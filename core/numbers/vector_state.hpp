#pragma once
// Clearing the upper halves of the x86 vector registers before a long computation.
//
// Core is compiled for the baseline x86-64 instruction set, so its floating-point code uses
// legacy (non-VEX) SSE instructions. If code that ran earlier on the same thread used 256- or
// 512-bit AVX instructions and did not execute VZEROUPPER afterwards, the upper halves of the
// vector registers stay "dirty", and every legacy SSE instruction then pays a transition penalty
// or a false dependency on the upper half (Intel 64 and IA-32 Architectures Optimization
// Reference Manual, "Mixing AVX code with SSE code" — section number from memory). Some of the
// libraries a Qt program loads leave that state behind; the same evaluation then runs 3-5 times
// slower in the editor and the report command than in the command line.
//
// The remedy at the boundary of our own code: every entry point that runs a long computation
// (case evaluation, on whichever thread the caller uses) clears the state first with VZEROUPPER,
// which costs a few cycles and changes no value. Nothing in core sets the upper halves again
// (legacy SSE does not touch them; the C library's AVX routines clear them on return).

namespace counterpoise::numbers {

// Executes VZEROUPPER when the processor supports AVX; does nothing elsewhere (other
// architectures, or x86 processors without AVX, where the instruction does not exist).
void clear_upper_vector_state() noexcept;

}  // namespace counterpoise::numbers
