#pragma once

#include "atmosphere/reference_profile.hpp"

namespace ds {

/// The Titan standard profile: the nominal engineering profile as quoted by Justus and Braun
/// (2007) from 0 to 500 km, then isothermal and hydrostatic at its 500 km temperature with the
/// body's gas (see the .cpp for the sources and how sure the values are).
ReferenceProfile titan_engineering_profile();

}  // namespace ds
