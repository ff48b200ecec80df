// Package pulse models terahertz waveforms, computes their spectra and
// metrics, and calibrates them to absolute field.
//
// Internally every quantity is SI (V/m, s, Hz, J, m); the trade's units appear
// only in the server and the command-line tool (see package units).
//
// The Fourier convention is fixed once, in Transform: time dependence
// e^{-i w t}, forward transform E(w) = ∫ E(t) e^{+i w t} dt.
package pulse
