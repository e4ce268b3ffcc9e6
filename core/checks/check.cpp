#include "checks/check.hpp"

namespace ds {

std::string_view to_string(CheckStatus status) {
    switch (status) {
        case CheckStatus::pass:
            return "pass";
        case CheckStatus::marginal:
            return "marginal";
        case CheckStatus::fail:
            return "fail";
    }
    return "fail";  // not reached: every enumerator is handled above
}

}  // namespace ds
