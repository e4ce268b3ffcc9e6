#include "design/key_path.hpp"

#include <algorithm>

namespace ds {

std::string key_to_pointer(std::string_view key) {
    std::string pointer = "/";
    for (const char c : key) {
        if (c == '.' || c == '[') {
            pointer += '/';
        } else if (c != ']') {
            pointer += c;
        }
    }
    return pointer;
}

std::string pointer_to_key(std::string_view pointer) {
    std::string path;
    std::size_t start = 1;
    while (start <= pointer.size()) {
        const std::size_t end = std::min(pointer.find('/', start), pointer.size());
        const std::string_view token = pointer.substr(start, end - start);
        const bool index =
            !token.empty() && token.find_first_not_of("0123456789") == std::string_view::npos;
        if (index) {
            path += "[";
            path += token;
            path += "]";
        } else {
            if (!path.empty())
                path += ".";
            path += token;
        }
        start = end + 1;
    }
    return path;
}

}  // namespace ds
