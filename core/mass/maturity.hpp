#pragma once

namespace ds {

/// Design maturity of a mass item: sets its growth allowance (AIAA S-120; see
/// mass/growth.hpp).
enum class Maturity { estimated, layout, pre_release, released, existing, actual };

}  // namespace ds
