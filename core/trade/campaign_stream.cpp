// Reading a campaign's document case by case (read_campaign): a merge of a million-case
// campaign holds one case at a time, not the document.

#include <fstream>
#include <memory>
#include <string_view>

#include <fmt/format.h>

#include "design/text_file.hpp"
#include "trade/dispersion.hpp"

namespace ds {
namespace {

using Json = nlohmann::ordered_json;
using DomBuilder = nlohmann::detail::json_sax_dom_parser<Json>;

/// Deeper than any campaign nests (a case's landing is four levels down): such a document is
/// refused before anyone walks it.
constexpr std::size_t max_campaign_depth = 64;

/// A SAX handler that builds the campaign's document without its cases: each element of the
/// campaign's "cases" (at the top, or under "campaign") is built on its own and handed to
/// `on_element` as soon as it is whole, then dropped.
class CaseStreamer {
public:
    CaseStreamer(Json& rest, std::function<bool(Json&&)> on_element)
        : rest_(rest, false), on_element_(std::move(on_element)) {}

    bool null() {
        return value([](DomBuilder& b) { return b.null(); });
    }
    bool boolean(bool v) {
        return value([v](DomBuilder& b) { return b.boolean(v); });
    }
    bool number_integer(Json::number_integer_t v) {
        return value([v](DomBuilder& b) { return b.number_integer(v); });
    }
    bool number_unsigned(Json::number_unsigned_t v) {
        return value([v](DomBuilder& b) { return b.number_unsigned(v); });
    }
    bool number_float(Json::number_float_t v, const Json::string_t& text) {
        return value([&](DomBuilder& b) { return b.number_float(v, text); });
    }
    bool string(Json::string_t& v) {
        return value([&](DomBuilder& b) { return b.string(v); });
    }
    bool binary(Json::binary_t& v) {
        return value([&](DomBuilder& b) { return b.binary(v); });
    }
    bool key(Json::string_t& k) {
        pending_key_ = k;
        return builder().key(k);
    }
    bool start_object(std::size_t size) { return open(false, size); }
    bool start_array(std::size_t size) { return open(true, size); }
    bool end_object() { return close(); }
    bool end_array() { return close(); }
    bool parse_error(std::size_t position, const std::string& token,
                     const nlohmann::detail::exception& e) {
        error_ = fmt::format("{} (at byte {}, near '{}')", e.what(), position, token);
        // Nothing but white space came (the token may hold it, escaped).
        empty_ = !started_ &&
                 std::string_view(e.what()).find("unexpected end of input") != std::string::npos;
        return false;
    }

    const std::string& error() const { return error_; }
    /// Whether the document ended before anything but white space came.
    bool empty() const { return empty_; }

private:
    struct Level {
        bool array = false;
        std::string key;  ///< the key it is under, in its parent object
    };

    DomBuilder& builder() { return element_ ? *element_ : rest_; }

    /// Whether the innermost open level is the campaign's "cases": an array under "cases" in
    /// the top object, or in the "campaign" object at the top.
    bool in_cases() const {
        const std::size_t n = levels_.size();
        if (n < 2 || !levels_[n - 1].array || levels_[n - 1].key != "cases")
            return false;
        return n == 2 || (n == 3 && levels_[1].key == "campaign");
    }

    template <class Event>
    bool value(Event event) {
        started_ = true;
        if (!element_ && in_cases()) {  // a scalar case: handed on as it is
            Json scalar;
            DomBuilder single(scalar, false);
            event(single);
            return on_element_(std::move(scalar));
        }
        return event(builder());
    }

    bool open(bool array, std::size_t size) {
        started_ = true;
        if (levels_.size() + element_levels_.size() >= max_campaign_depth) {
            error_ =
                fmt::format("arrays and objects nest more than {} levels deep", max_campaign_depth);
            return false;
        }
        if (!element_ && in_cases()) {
            element_json_ = Json();
            element_ = std::make_unique<DomBuilder>(element_json_, false);
        }
        if (element_)
            element_levels_.push_back(array);
        else
            levels_.push_back({array, levels_.empty() ? std::string() : pending_key_});
        pending_key_.clear();
        return array ? builder().start_array(size) : builder().start_object(size);
    }

    bool close() {
        if (!element_) {
            const bool array = levels_.back().array;
            levels_.pop_back();
            return array ? rest_.end_array() : rest_.end_object();
        }
        const bool array = element_levels_.back();
        element_levels_.pop_back();
        const bool closed = array ? element_->end_array() : element_->end_object();
        if (!element_levels_.empty())
            return closed;
        element_.reset();
        return closed && on_element_(std::move(element_json_));
    }

    DomBuilder rest_;
    std::function<bool(Json&&)> on_element_;
    std::vector<Level> levels_;
    std::string pending_key_;
    Json element_json_;
    std::unique_ptr<DomBuilder> element_;
    std::vector<bool> element_levels_;  ///< open in the case being built: whether an array
    std::string error_;
    bool started_ = false;
    bool empty_ = false;
};

}  // namespace

std::optional<DispersionCampaign> read_campaign(
    std::istream& in, const std::function<void(const DispersedCase&)>& on_case,
    std::string* error) {
    // The document's own keys are checked against one another once it has been read; its
    // cases as they come, against the head when it came first (as disperse writes it), or
    // at the end against the head that came after them.
    Json rest;
    std::optional<DispersionCampaign> head;
    std::optional<ShardCases> shard;
    CaseDigest digest;
    std::string problem;
    const auto campaign_part = [&rest]() -> const Json& {
        return rest.is_object() && rest.contains("campaign") ? rest.at("campaign") : rest;
    };
    // Cases that came before their head (a document whose keys were reordered, by a tool that
    // sorts them): held until the head has been read. disperse writes the head first.
    std::vector<Json> early;
    const auto take_case = [&](Json&& element) {
        if (!head && early.empty()) {
            std::string not_yet;
            head = campaign_head_from_json(campaign_part(), &not_yet);
            if (head)
                shard.emplace(*head);
        }
        if (!head) {
            early.push_back(std::move(element));
            return true;
        }
        std::optional<DispersedCase> c = case_from_json(element, &problem);
        if (!c)
            return false;
        problem = shard->add(*c);
        if (!problem.empty())
            return false;
        digest.add(*c);
        if (on_case)
            on_case(*c);
        return true;
    };
    CaseStreamer streamer(rest, take_case);
    const bool parsed = Json::sax_parse(in, &streamer, nlohmann::detail::input_format_t::json,
                                        /*strict=*/true);
    if (!parsed) {
        if (!problem.empty())
            *error = problem;
        else if (streamer.empty())
            *error = "empty: not a disperse --json output (did its shard's run fail?)";
        else
            *error = fmt::format(
                "not a whole disperse --json output (cut short: did its shard's run finish?): {}",
                streamer.error());
        return std::nullopt;
    }
    std::optional<DispersionCampaign> read = campaign_head_from_json(campaign_part(), error);
    if (!read)
        return std::nullopt;
    if (!campaign_part().contains("cases") || !campaign_part().at("cases").is_array()) {
        *error = "not a dispersion campaign: no \"cases\"";
        return std::nullopt;
    }
    if (!shard) {  // no case came before the head was whole
        head = read;
        shard.emplace(*read);
    }
    for (Json& element : early) {
        if (!take_case(std::move(element))) {
            *error = problem;
            return std::nullopt;
        }
    }
    if (std::string missing = shard->missing(); !missing.empty()) {
        *error = std::move(missing);
        return std::nullopt;
    }
    if (std::string why = part_digest_problem(*read, digest.hex()); !why.empty()) {
        *error = std::move(why);
        return std::nullopt;
    }
    return read;
}

std::optional<DispersionCampaign> read_campaign_file(
    const std::filesystem::path& file, const std::function<void(const DispersedCase&)>& on_case,
    std::string* error) {
    // A part may be gigabytes: read as a stream, not whole, but only from a regular file (a
    // pipe would block the reading, a device feed it without end).
    if (std::string problem = not_a_regular_file(file); !problem.empty()) {
        *error = std::move(problem);
        return std::nullopt;
    }
    std::ifstream in(file, std::ios::binary);
    if (!in) {
        *error = "cannot be opened";
        return std::nullopt;
    }
    return read_campaign(in, on_case, error);
}

}  // namespace ds
