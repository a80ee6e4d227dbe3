// Aperture averaging: the correlation measured between two mirrors of finite size.
//
// Each mirror collects light over its whole area, so the measured correlation is |V|^2 averaged over all
// baseline vectors b = B0 + r2 - r1 between a point r1 of mirror 1 and a point r2 of mirror 2, both
// uniformly weighted over circular, filled pupils of diameters D1 and D2 (models.md §1.9). The
// difference s = r2 - r1 has the density K(s) = A_overlap(|s|; R1, R2) / (A1 A2) (the cross-correlation
// of the two pupils, which integrates to 1), so
//
//   <|V|^2>(B0) = ∫_0^{R1+R2} s K(s) ∫_0^{2 pi} |V(B0 + s (sin phi, cos phi))|^2 dphi ds,
//
// with A_overlap the area of the lens where two circles of radii R1, R2 at distance s overlap.
// Quadrature (deterministic): Gauss-Legendre in s, 16 points per panel, panels split at |R1 - R2| (the
// kink of K) and sized to ~1 radian of model phase; the trapezoidal rule in phi (spectrally accurate for
// a periodic integrand) with enough points for the model's variation around each circle. For a radially
// symmetric model at B0 = 0 the phi integral is 2 pi |V(s)|^2 and the s integral alone is done.
// Accuracy: a few 1e-9 absolute (against an independent scipy quadrature in
// tests/astro/instrument_response_test.cpp; the kernel's (R1+R2-s)^(3/2) end point limits the panels).
//
// Small-mirror limit (second moment of K, <s^2> = (D1^2 + D2^2)/8, with |V|^2 ~ 1 - x^2/4 for a UD):
//   <|V|^2>(0) ~ 1 - (pi theta/lambda)^2 (D1^2 + D2^2)/32,  i.e. 1 - (pi theta D/(4 lambda))^2 for D1 = D2;
//   D = 12 m, theta = 0.5 mas, 420 nm: 0.99704 (models.md §1.9). For theta = 5 mas this first-order
//   formula gives 0.704 while the full average is 0.757: use the quadrature for large stars.
// Tested in: tests/astro/aperture_average_test.cpp
#pragma once

#include <span>

#include "astro/models.hpp"

namespace siiplan::astro {

// Given:   model; B0 = (u_m, v_m), the projected baseline between the mirror centres in metres (u East,
//          v North); lambda_m > 0; mirror diameters d1_m, d2_m >= 0 (0 = a point).
// Returns: <|V|^2> over the two apertures as defined above.
// Throws:  RuntimeFailure when the mirrors resolve the source so strongly that the quadrature would need
//          more than ~2e7 model evaluations (x = pi scale (D1+D2)/(2 lambda) beyond ~1e5 at B0 = 0 for
//          radially symmetric models, ~300 otherwise).
double aperture_averaged_vis2(const Model& model, double u_m, double v_m, double lambda_m, double d1_m, double d2_m);
// The same and its gradient with respect to the model parameters (grad.size() == params().size()), by the
// same quadrature applied to Model::vis2_and_gradient.
double aperture_averaged_vis2_and_gradient(const Model& model, double u_m, double v_m, double lambda_m, double d1_m,
                                           double d2_m, std::span<double> grad);

// First-order estimate of the zero-baseline loss 1 - <|V|^2>(0) for a uniform disk of diameter theta_rad:
// (pi theta/lambda)^2 (D1^2 + D2^2)/32. Valid while it is << 1.
double aperture_loss_first_order(double theta_rad, double lambda_m, double d1_m, double d2_m);

// Whether single mirrors partly resolve the star: the zero-baseline correlation of two such mirrors side
// by side (B0 = 0) is reduced by more than `threshold` (default 1 %, our choice: about the calibration
// accuracy of the zero-baseline correlation in practice) relative to point-like mirrors.
struct ApertureEffect {
  double vis2_zero_baseline;   // <|V|^2>(B0 = 0)
  double loss;                 // 1 - vis2_zero_baseline
  bool matters;                // loss > threshold
};
ApertureEffect aperture_effect(const Model& model, double lambda_m, double d1_m, double d2_m, double threshold = 0.01);

}  // namespace siiplan::astro
