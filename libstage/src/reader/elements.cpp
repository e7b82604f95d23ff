// Building each element kind of spec section 3 from its arguments: terminals
// become (hierarchical) node names, values are checked for unit and physical
// range, waveforms (waveforms.cpp) and controlling references are read.
#include <cmath>

#include "reader/elaborator.hpp"
#include "reader/suggest.hpp"
#include "stage/errors.hpp"

namespace stage::elaborate {

namespace x3 = boost::spirit::x3;

double Elaborator::value(const BoundArguments& args, std::string_view name, Quantity q,
                         const Frame& frame, double fallback, bool allow_infinity) {
  const ast::Expr* e = args.get(name);
  if (!e) return fallback;
  return reader::evaluate_as(*e, q, *frame.scope, frame.file->source, allow_infinity);
}

void Elaborator::element(const ast::Instance& instance, const Frame& frame) {
  const std::string& keyword = instance.call.name;
  const std::string name = element_name(instance.name, frame);
  std::optional<ElementData> data;
  kinds::for_each_kind([&](const auto& kind) {
    for (const auto& spelling : kind.spellings) {
      if (spelling.keyword == keyword) data = read_element(kind, spelling, instance, frame);
    }
  });
  const reader::SourceText& source = frame.file->source;
  if (!data) {
    // Perhaps a block defined further on.
    if (loader_) throw ReadCarefully{};
    std::vector<std::string> names = kinds::keywords();
    for (const auto& [block, where] : blocks_) names.push_back(block);
    source.fail(instance.call.offset, "unknown element kind or block '" + keyword + "'" +
                                          reader::suggestion(keyword, names));
  }
  const auto taken = [&] {
    source.fail(instance.offset, "an element named '" + name + "' already exists");
  };
  if (block_instances_.count(name)) taken();
  // The circuit looks the name up once, as it adds (a large circuit's index
  // is costly to probe twice).
  try {
    deck_.circuit.add(name, std::move(*data));
  } catch (const Error& e) {
    if (e.kind() != ErrorKind::invalid_request) throw;
    taken();
  }
  deck_.places.add(name, frame.file->index, instance.offset);
}

// Reads each argument into its field, checking a value against its field's
// range where it is written.
template <class E>
E Elaborator::read_element(const kinds::Descriptor<E>& kind, const kinds::Spelling<E>& spelling,
                           const ast::Instance& instance, const Frame& frame) {
  const reader::SourceText& source = frame.file->source;
  // One list a kind (read_element is instantiated a kind), made once.
  static const std::vector<Slot> slots = [&] {
    std::vector<Slot> list;
    for (const auto& f : kind.fields) list.push_back({f.name, f.is_positional, f.is_required});
    return list;
  }();
  const BoundArguments args(instance.call, slots, spelling.keyword, source);
  E e{};
  if (spelling.preset != nullptr) spelling.preset(e);
  const auto checked = [&](const kinds::Field<E>& f, double v) {
    if (auto why = range_error(f.range, v)) {
      source.fail(args.offset(f.name), std::string(spelling.keyword) + " " + std::string(f.name) +
                                           " " + std::string(*why) + std::string(f.hint));
    }
    return v;
  };
  for (const auto& f : kind.fields) {
    const ast::Expr* given = args.get(f.name);
    if (given == nullptr) continue;
    switch (f.kind) {
      case kinds::FieldKind::terminal:
        e.*f.text = node(*given, frame);
        break;
      case kinds::FieldKind::optional_terminal:
        e.*f.optional_text = node(*given, frame);
        break;
      case kinds::FieldKind::value:
        e.*f.number = checked(f, value(args, f.name, f.quantity, frame));
        break;
      case kinds::FieldKind::optional_value:
        e.*f.optional_number = checked(f, value(args, f.name, f.quantity, frame));
        break;
      case kinds::FieldKind::waveform:
        e.*f.wave = waveform(*given, f.quantity, frame);
        break;
      case kinds::FieldKind::control_pair:
        std::tie(e.*f.text, e.*f.second) = node_pair(*given, args.offset(f.name), frame);
        break;
      case kinds::FieldKind::sensed_element:
        e.*f.text = element_name(require_name(*given, "an element name", source), frame);
        references_.push_back({frame.file, args.offset(f.name), e.*f.text, {}});
        break;
      case kinds::FieldKind::model:
        e.*f.text = require_name(*given, "the name of a model (from a `model` statement)", source);
        references_.push_back(
            {frame.file, args.offset(f.name), e.*f.text, std::string(kind.model_kind(e))});
        break;
    }
  }
  if (kinds::has(kind.roles, kinds::Role::holds_voltage)) {
    const std::vector<std::string> ends = kinds::nodes(ElementData(e));
    if (ends[0] == ends[1]) {
      source.fail(instance.offset, "'" + instance.name + "' holds a voltage between '" + ends[0] +
                                       "' and itself: give its two terminals different nodes");
    }
  }
  for (const auto& f : kind.fields) {
    if (f.defaults_to_wave_start && args.get(f.name) == nullptr) {
      for (const auto& w : kind.fields) {
        if (w.kind == kinds::FieldKind::waveform && (e.*w.wave)) {
          e.*f.number = waveform_value(*(e.*w.wave), 0.0);
        }
      }
    }
  }
  return e;
}

std::pair<std::string, std::string> Elaborator::node_pair(const ast::Expr& e, int offset,
                                                          const Frame& frame) {
  const auto* tuple = boost::get<x3::forward_ast<ast::Tuple>>(&ast::unwrap(e));
  if (!tuple || tuple->get().items.size() != 2) {
    frame.file->source.fail(offset, "expected control = (node, node)");
  }
  return {node(tuple->get().items[0], frame), node(tuple->get().items[1], frame)};
}

}  // namespace stage::elaborate
