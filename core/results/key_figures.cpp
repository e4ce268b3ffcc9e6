#include "results/key_figures.hpp"

namespace ds {

std::vector<std::optional<double>> key_figure_values(const Results& results) {
    std::vector<std::optional<double>> values;
    values.reserve(key_figure_table.size());
    for (const KeyFigureDefinition& figure : key_figure_table)
        values.push_back(figure.value(results));
    return values;
}

std::optional<std::size_t> key_figure_index(std::string_view id) {
    for (std::size_t i = 0; i < key_figure_table.size(); ++i) {
        if (key_figure_table[i].id == id)
            return i;
    }
    return std::nullopt;
}

std::vector<KeyFigure> key_figures(const Results& results) {
    std::vector<KeyFigure> figures;
    figures.reserve(key_figure_table.size());
    for (const KeyFigureDefinition& f : key_figure_table) {
        figures.push_back({std::string(f.id), std::string(f.label), f.value(results),
                           std::string(f.unit), f.decimals});
    }
    return figures;
}

}  // namespace ds
