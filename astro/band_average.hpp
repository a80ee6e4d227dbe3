// Squared visibility averaged over an optical filter (finite bandwidth).
//
// Intensity interferometry measures a second-order quantity: the correlation is a product of the
// intensity fluctuations of both telescopes, so each wavelength contributes in proportion to the SQUARE
// of its detected photon flux (models.md §1.9, last bullet):
//
//   <|V|^2> = ∫ w(lambda) |V(u_m/lambda, v_m/lambda)|^2 dlambda / ∫ w(lambda) dlambda,
//   w(lambda) = [n(lambda) T(lambda)]^2,
//
// with T the filter transmission and n the source's photon flux per unit wavelength, which is taken as
// constant across the filter (adequate for filters of a few % width; a steep stellar spectrum would
// tilt w). So w = T^2:
//   top-hat   T = 1 on [lambda0 - dl/2, lambda0 + dl/2]    -> w = T, uniform over the band;
//   Gaussian  T = exp(-4 ln2 (lambda-lambda0)^2/dl^2)      -> w = T^2, a Gaussian of FWHM dl/sqrt(2).
// dl = bandwidth_m is the full width (FWHM for the Gaussian), as in astro::Instrument.
//
// Quadrature: Gauss-Legendre, 16 points per panel, panels so that each covers at most ~1 radian of change
// in the model's phase pi*scale*|b|/lambda (scale = angular_scale_rad); the Gaussian weight is integrated
// over lambda0 +- 8 sigma (neglected tails < 1e-14) in at least 8 panels. Deterministic, ~1e-12 relative.
// Tested in: tests/astro/band_average_test.cpp
#pragma once

#include <functional>
#include <span>

#include "astro/models.hpp"
#include "astro/sensitivity.hpp"

namespace siiplan::astro {

struct Filter {
  double lambda_m = 0;        // central wavelength (> 0)
  double bandwidth_m = 0;     // full width; 0 = monochromatic
  FilterProfile profile = FilterProfile::TopHat;
};

// Given:   model, the projected baseline (u_m, v_m) in metres (u East, v North), the filter.
// Returns: <|V|^2> over the filter, weighted by T(lambda)^2 as above; equals model.vis2(u/lambda0, v/lambda0)
//          for bandwidth 0.
// Throws:  InputError when lambda_m <= 0, bandwidth_m < 0, or the band reaches lambda <= 0.
double band_averaged_vis2(const Model& model, double u_m, double v_m, const Filter& filter);

// The same and its gradient with respect to the model parameters (grad.size() == params().size()).
double band_averaged_vis2_and_gradient(const Model& model, double u_m, double v_m, const Filter& filter,
                                       std::span<double> grad);

// The band quadrature above for any n values that depend on wavelength: g(lambda_m, out) writes them at one
// wavelength; out (size >= n) receives their T^2-weighted averages. The panels are sized from the model
// and the baseline (u_m, v_m) as above. Bandwidth 0: g at the central wavelength.
void band_average_values(const Model& model, double u_m, double v_m, const Filter& filter, std::size_t n,
                         const std::function<void(double, std::span<double>)>& g, std::span<double> out);

}  // namespace siiplan::astro
