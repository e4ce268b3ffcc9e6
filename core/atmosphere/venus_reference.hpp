#pragma once

#include "atmosphere/reference_profile.hpp"

namespace ds {

/// The Venus standard profile: the Venus International Reference Atmosphere (VIRA; Seiff et
/// al., Adv. Space Res. 5(11), 1985) from 0 to 100 km, then isothermal and hydrostatic at its
/// 100 km temperature with the body's gas (see the .cpp for why, and how sure the values are).
ReferenceProfile venus_reference_profile();

}  // namespace ds
