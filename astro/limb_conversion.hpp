// Conversion between uniform-disk (UD) and limb-darkened (LD) angular diameters.
//
// A UD fitted to data from a limb-darkened star returns a smaller diameter than the LD one; the ratio
// theta_LD/theta_UD depends on the limb-darkening law AND on which baselines the fit used, so the
// criterion must be stated (models.md §2). Two criteria are provided:
//
//   ShortBaseline  match the curvature of |V|^2 at zero baseline, i.e. the second moment of the
//                  brightness. For I = sum_k c_k mu^k:
//                    <r^2>/R^2 = sum c_k [1/(k+2) - 1/(k+4)] / sum c_k/(k+2),  UD: 1/2,
//                    theta_LD/theta_UD = sqrt( (1/2) / (<r^2>/R^2) ).
//                  Linear law: sqrt((1 - u/3)/(1 - 7u/15)), the formula of Hanbury Brown, Davis, Lake &
//                  Thompson 1974, MNRAS 167, 475; power law mu^alpha: sqrt(1 + alpha/4).
//                  Exact only for very short baselines.
//   FirstLobeLeastSquares  the ratio k minimising ∫_0^X [|V_UD(x/k)|^2 - |V_LD(x)|^2]^2 dx with
//                  X = 0.95 x0, x0 the LD first null (the continuous limit of a UD fit to |V|^2 sampled
//                  uniformly in baseline over the first lobe; models.md §2 column (e)). Closest to what a
//                  UD fit of first-lobe data returns.
// Example (models.md §2): linear u = 0.6: 1.054093 (ShortBaseline), 1.059047 (FirstLobeLeastSquares).
// Tested in: tests/astro/limb_conversion_test.cpp
#pragma once

#include "astro/models.hpp"

namespace siiplan::astro {

enum class LimbCriterion { ShortBaseline, FirstLobeLeastSquares };

// theta_LD/theta_UD for a limb-darkened model (ld-linear, ld-quadratic, ld-power; 1 for ud). The ratio
// does not depend on the model's diameter. Throws InputError for other model kinds.
double ld_over_ud_ratio(const Model& ld_model, LimbCriterion criterion);

// The short-baseline ratio of the linear law in closed form (Hanbury Brown et al. 1974).
double hb74_ld_over_ud_ratio(double limb_u);

// The UD diameter (rad) equivalent to ld_model under the criterion.
double ud_diameter_rad(const Model& ld_model, LimbCriterion criterion);

// The LD model (same law and coefficients as ld_law; its diameter is ignored) whose UD equivalent under
// the criterion is theta_ud_rad.
Model ld_model_from_ud(double theta_ud_rad, const Model& ld_law, LimbCriterion criterion);

}  // namespace siiplan::astro
