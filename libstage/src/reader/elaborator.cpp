// The walk over a deck's statements in file order: titles, lets (with
// overrides), includes, temperature, solver settings, models, element and
// block instances, analyses; then the references that could point forward.
#include "reader/elaborator.hpp"

#include <algorithm>
#include <cmath>

#include "reader/grammar.hpp"
#include "reader/suggest.hpp"
#include "reader/unit_table.hpp"

namespace stage::elaborate {

namespace x3 = boost::spirit::x3;

namespace {
// Deeper block nesting than this is surely a mistake; it also bounds recursion.
constexpr std::size_t kMaxBlockDepth = 50;
// Blocks that instance others twice double at each level: a small file can
// ask for more elements than any machine holds. Ten million elements, about
// 3 GB, is more than three times the largest circuit the project measures.
constexpr std::size_t kMaxExpandedElements = 10'000'000;

Deck elaborate_with(std::shared_ptr<const SyntaxTree> tree, reader::Loader* loader,
                    const ReadOptions& options) {
  Deck deck;
  deck.options = options;
  deck.tree = tree;
  deck.file = tree->files.front().source.file_name();
  deck.places = Places(tree);
  Elaborator(*tree, loader, deck.options, deck).run();
  return deck;
}
}  // namespace

Deck elaborate(std::shared_ptr<const SyntaxTree> tree, const ReadOptions& options) {
  return elaborate_with(std::move(tree), nullptr, options);
}

Deck read(std::shared_ptr<SyntaxTree> tree, reader::Loader& loader, const ReadOptions& options) {
  return elaborate_with(std::move(tree), &loader, options);
}

Elaborator::Elaborator(const SyntaxTree& tree, reader::Loader* loader, const ReadOptions& options,
                       Deck& deck)
    : tree_(tree), loader_(loader), options_(options), deck_(deck) {}

void Elaborator::fail(const Frame& frame, int offset, const std::string& message) const {
  frame.file->source.fail(offset, message);
}

void Elaborator::run() {
  const File& main = tree_.files.front();
  if (!loader_) collect_blocks(main);
  file_statements(main);
  deck_.places.index();
  check_references();
  std::vector<std::string> overridden;
  for (const auto& [name, value] : options_.overrides) overridden.push_back(name);
  for (const auto& [name, text] : options_.written_overrides) overridden.push_back(name);
  for (const std::string& name : overridden) {
    if (!used_overrides_.count(name)) {
      std::vector<std::string> lets = globals_.names();
      throw InputError({"--set", 0, 0}, "'" + name + "' names no let parameter of " +
                                            main.source.file_name() +
                                            reader::suggestion(name, lets));
    }
  }
  for (const auto& [file, analyze] : analyses_) analysis(analyze, *file);
}

// Blocks may be used before they are defined, so a loaded tree's are
// gathered first.
void Elaborator::collect_blocks(const File& file) {
  for (const ast::Statement& statement : file.blocks_and_includes) {
    if (const auto* b = boost::get<x3::forward_ast<ast::Block>>(&statement)) {
      define_block(file, b->get());
    } else if (const auto* include = boost::get<ast::Include>(&statement)) {
      const int index = file.includes.at(include->offset);
      if (index >= 0) collect_blocks(tree_.files[index]);
    }
  }
}

void Elaborator::define_block(const File& file, const ast::Block& block) {
  const std::vector<std::string> keywords = kinds::keywords();
  if (std::find(keywords.begin(), keywords.end(), block.name) != keywords.end()) {
    file.source.fail(block.offset,
                     "a block cannot be named like the element kind '" + block.name + "'");
  }
  if (!blocks_.emplace(block.name, std::make_pair(&file, &block)).second) {
    file.source.fail(block.offset, "a block named '" + block.name + "' is already defined");
  }
  for (const ast::Statement& inner : block.body) {
    if (boost::get<x3::forward_ast<ast::Block>>(&inner)) {
      file.source.fail(ast::offset_of(inner), "blocks are defined outside other blocks");
    }
  }
}

// A file's statements are parsed here one at a time and dropped once
// elaborated; when files are loaded as they are met, its blocks and includes
// are handed to the tree (for Deck::with_parameter) as they are read.
void Elaborator::file_statements(const File& file) {
  if (file.instances > 0) {
    room_ += file.instances;
    room_name_bytes_ += file.instance_name_bytes;
    deck_.circuit.reserve(room_);
    deck_.places.reserve(room_, room_name_bytes_);
  }
  const Frame frame{&file, "", {}, &globals_, {}};
  if (loader_) loader_->enter(file.index);
  reader::StatementStream stream(file.source);
  while (std::optional<ast::Statement> statement = stream.next()) {
    const bool block = boost::get<x3::forward_ast<ast::Block>>(&*statement) != nullptr;
    if (loader_ && (block || boost::get<ast::Include>(&*statement))) {
      const ast::Statement& kept = loader_->keep(file.index, std::move(*statement));
      if (block) define_block(file, boost::get<x3::forward_ast<ast::Block>>(kept).get());
      this->statement(kept, frame);
    } else {
      this->statement(*statement, frame);
    }
  }
  if (loader_) loader_->leave();
}

void Elaborator::statements(const std::vector<ast::Statement>& list, const Frame& frame) {
  for (const ast::Statement& statement : list) this->statement(statement, frame);
}

void Elaborator::statement(const ast::Statement& statement, const Frame& frame) {
  const bool top = frame.blocks.empty();
  // Lets inside a block instance are local to it.
  reader::Scope& scope = *frame.scope;
  const int at = ast::offset_of(statement);
  const auto top_only = [&](const char* what) {
    if (!top) fail(frame, at, std::string(what) + " is not allowed inside a block");
  };
  if (const auto* title = boost::get<ast::Title>(&statement)) {
    top_only("title");
    if (have_title_) fail(frame, at, "the title is given twice");
    have_title_ = true;
    deck_.circuit.title = title->text;
  } else if (const auto* l = boost::get<ast::Let>(&statement)) {
    let(*l, frame, scope);
  } else if (const auto* include = boost::get<ast::Include>(&statement)) {
    top_only("include");
    const int index = loader_ ? loader_->open(frame.file->index, *include)
                              : frame.file->includes.at(include->offset);
    if (index >= 0) file_statements(tree_.files[index]);
  } else if (const auto* t = boost::get<ast::Temperature>(&statement)) {
    top_only("temperature");
    const double kelvin =
        reader::evaluate_as(t->value, Quantity::temperature, scope, frame.file->source);
    if (kelvin <= 0) fail(frame, ast::offset_of(t->value), "the temperature must be above 0 K");
    deck_.circuit.temperature = kelvin;
  } else if (const auto* s = boost::get<ast::Solver>(&statement)) {
    top_only("solver");
    solver(*s, frame);
  } else if (const auto* m = boost::get<ast::Model>(&statement)) {
    top_only("model");
    model(*m, frame);
  } else if (const auto* a = boost::get<ast::Analyze>(&statement)) {
    top_only("analyze");
    analyses_.emplace_back(frame.file, *a);
  } else if (const auto* instance = boost::get<ast::Instance>(&statement)) {
    if (blocks_.count(instance->call.name)) {
      instantiate_block(*instance, frame);
    } else {
      element(*instance, frame);
    }
  }
  // Block definitions were gathered by collect_blocks() or define_block().
}

void Elaborator::let(const ast::Let& let, const Frame& frame, reader::Scope& scope) {
  if (let.name == "pi" || let.name == "inf") {
    fail(frame, let.offset, "'" + let.name + "' is a constant and cannot be redefined");
  }
  if (scope.contains_here(let.name)) {
    fail(frame, let.offset, "the parameter '" + let.name + "' is already defined");
  }
  reader::Value value = reader::evaluate(let.value, scope, frame.file->source);
  const auto override = options_.overrides.find(let.name);
  const auto written = options_.written_overrides.find(let.name);
  if (frame.blocks.empty() && override != options_.overrides.end()) {
    value.number = override->second;
    used_overrides_.insert(let.name);
  } else if (frame.blocks.empty() && written != options_.written_overrides.end()) {
    value = written_override(let.name, written->second, value, scope);
    used_overrides_.insert(let.name);
  }
  if (std::isnan(value.number)) fail(frame, let.offset, "this value is not a number");
  scope.set(let.name, value);
}

// A --set value, read as the language reads a `let`'s (units, prefixes,
// expressions over the parameters above), in a source of its own so that an
// error names the command line; its unit must fit the one it replaces.
reader::Value Elaborator::written_override(const std::string& name, const std::string& text,
                                           const reader::Value& replaced,
                                           const reader::Scope& scope) const {
  const reader::SourceText source("--set", "let " + name + " = " + text + "\n");
  const ast::File parsed = reader::parse(source);
  const auto* let =
      parsed.statements.size() == 1 ? boost::get<ast::Let>(&parsed.statements[0]) : nullptr;
  if (let == nullptr) source.fail(0, "expected NAME=VALUE, a value as a let statement takes");
  reader::Value value = reader::evaluate(let->value, scope, source);
  if (value.quantity && replaced.quantity &&
      !reader::units_fit(*value.quantity, *replaced.quantity)) {
    source.fail(ast::offset_of(let->value),
                "'" + name + "' is in " + std::string(unit_name(*replaced.quantity)) +
                    " in the file; this value is in " + std::string(unit_name(*value.quantity)));
  }
  if (!value.quantity) value.quantity = replaced.quantity;
  return value;
}

void Elaborator::solver(const ast::Solver& solver, const Frame& frame) {
  static constexpr Slot kSlots[] = {{"relative_tolerance"}, {"voltage_tolerance"},
                                    {"current_tolerance"},  {"max_newton_iterations"},
                                    {"integration"},        {"minimum_conductance"}};
  const ast::Call call{{solver.offset}, "solver", solver.arguments};
  const BoundArguments args(call, kSlots, "solver", frame.file->source);
  SolverOptions& options = deck_.solver;
  const auto positive = [&](std::string_view name, Quantity q, double& field) {
    if (!args.get(name)) return;
    field = value(args, name, q, frame);
    if (field <= 0) fail(frame, args.offset(name), std::string(name) + " must be positive");
  };
  positive("relative_tolerance", Quantity::ratio, options.relative_tolerance);
  positive("voltage_tolerance", Quantity::voltage, options.voltage_tolerance);
  positive("current_tolerance", Quantity::current, options.current_tolerance);
  positive("minimum_conductance", Quantity::conductance, options.minimum_conductance);
  if (args.get("max_newton_iterations")) {
    const double n = value(args, "max_newton_iterations", Quantity::dimensionless, frame);
    if (n < 1 || n > 1e6 || n != std::floor(n)) {
      fail(frame, args.offset("max_newton_iterations"),
           "max_newton_iterations must be a whole number from 1 to 1000000");
    }
    options.max_newton_iterations = static_cast<int>(n);
  }
  if (const ast::Expr* e = args.get("integration")) {
    const std::string method =
        require_choice(*e, {"tr_bdf2", "trapezoidal", "bdf2"}, frame.file->source);
    options.integration = method == "bdf2"          ? Integration::bdf2
                          : method == "trapezoidal" ? Integration::trapezoidal
                                                    : Integration::tr_bdf2;
  }
}

std::size_t Elaborator::expanded_size(const std::string& block) {
  if (const auto known = expanded_sizes_.find(block); known != expanded_sizes_.end())
    return known->second;
  expanded_sizes_[block] = 0;  // a block that contains itself fails where it is instanced
  std::size_t size = 0;
  for (const ast::Statement& statement : blocks_.at(block).second->body) {
    const auto* instance = boost::get<ast::Instance>(&statement);
    if (instance == nullptr) continue;
    const std::size_t adds =
        blocks_.count(instance->call.name) ? expanded_size(instance->call.name) : 1;
    size = std::min(size + adds, kMaxExpandedElements + 1);  // saturates: never overflows
  }
  return expanded_sizes_[block] = size;
}

void Elaborator::instantiate_block(const ast::Instance& instance, const Frame& frame) {
  const auto& [file, block] = blocks_.at(instance.call.name);
  for (const std::string& active : frame.blocks) {
    if (active == block->name) {
      std::string chain;
      for (const std::string& b : frame.blocks) chain += b + " -> ";
      fail(frame, instance.call.offset,
           "block '" + block->name + "' contains itself: " + chain + block->name);
    }
  }
  if (frame.blocks.size() >= kMaxBlockDepth) {
    fail(frame, instance.call.offset, "blocks are nested too deeply");
  }
  if (frame.blocks.empty() &&
      deck_.circuit.elements().size() + expanded_size(block->name) > kMaxExpandedElements) {
    fail(frame, instance.call.offset,
         "expanding block '" + block->name + "' here makes more than " +
             std::to_string(kMaxExpandedElements) +
             " elements in the circuit; does a block instance others many times over?");
  }
  std::vector<std::string> names;  // ports, then parameters
  for (const ast::Name& port : block->ports) names.push_back(port.text);
  for (const ast::Argument& parameter : block->parameters) {
    if (!parameter.key) {
      file->source.fail(parameter.offset, "a block parameter needs a default: name = value");
    }
    names.push_back(*parameter.key);
  }
  std::vector<Slot> slots;
  for (std::size_t i = 0; i < names.size(); ++i) {
    const bool port = i < block->ports.size();
    slots.push_back({names[i], port, port});
  }
  const BoundArguments args(instance.call, slots, "block " + block->name, frame.file->source);
  Frame inner{file, frame.prefix + instance.name + "/", {}, nullptr, frame.blocks};
  inner.blocks.push_back(block->name);
  for (const ast::Name& port : block->ports) {
    inner.ports[port.text] = node(*args.get(port.text), frame);
    port_nodes_.insert(inner.ports[port.text]);
  }
  // Defaults are read in the file's scope, values given here in the caller's.
  reader::Scope scope(&globals_);
  for (const ast::Argument& parameter : block->parameters) {
    const ast::Expr* given = args.get(*parameter.key);
    scope.set(*parameter.key, given ? reader::evaluate(*given, *frame.scope, frame.file->source)
                                    : reader::evaluate(parameter.value, globals_, file->source));
  }
  inner.scope = &scope;
  const std::string name = element_name(instance.name, frame);
  if (kind_of(name)) {
    fail(frame, instance.offset, "an element or instance named '" + name + "' already exists");
  }
  block_instances_.insert(name);
  statements(block->body, inner);
}

std::string Elaborator::element_name(const std::string& local, const Frame& frame) const {
  return frame.prefix + local;
}

std::string Elaborator::node(const ast::Expr& e, const Frame& frame) {
  const std::string name = require_name(e, "a node name", frame.file->source);
  const int at = ast::offset_of(e);
  if (name.find('.') != std::string::npos) fail(frame, at, "expected a node name");
  if (frame.scope->find(name) || name == "pi" || name == "inf") {
    fail(frame, at, "'" + name + "' is a parameter, not a node");
  }
  std::string global;
  if (name == kGround) {
    global = kGround;
  } else if (const auto port = frame.ports.find(name); port != frame.ports.end()) {
    global = port->second;
  } else {
    global = frame.prefix + name;
  }
  return global;
}

std::optional<std::string_view> Elaborator::kind_of(const std::string& name) const {
  if (const Element* e = deck_.circuit.find(name)) return kinds::keyword(e->data);
  if (block_instances_.count(name)) return "block";
  return std::nullopt;
}

std::vector<std::string> Elaborator::element_names() const {
  std::vector<std::string> names(block_instances_.begin(), block_instances_.end());
  for (const Element& e : deck_.circuit.elements()) names.push_back(e.name);
  std::sort(names.begin(), names.end());
  return names;
}

// Nodes are not kept aside while elements are read (a large circuit has
// millions): the first analysis that names one indexes the elements' nodes
// once, so that naming many costs one pass (and nodes given to block ports,
// which an element may not use, count too).
bool Elaborator::has_node(const std::string& name) const {
  if (port_nodes_.count(name)) return true;
  if (!element_nodes_) {
    element_nodes_.emplace();
    for (const Element& e : deck_.circuit.elements()) {
      kinds::for_each_node(e.data, [&](const std::string& node) { element_nodes_->insert(node); });
    }
  }
  return element_nodes_->count(name) > 0;
}

std::vector<std::string> Elaborator::node_names() const {
  std::set<std::string> nodes = port_nodes_;
  for (const Element& e : deck_.circuit.elements()) {
    kinds::for_each_node(e.data, [&](const std::string& node) { nodes.insert(node); });
  }
  return {nodes.begin(), nodes.end()};
}

// `sense = name`: an element's current or `<element>.<terminal>` (spec
// section 3), with near names suggested when it is neither.
void Elaborator::check_sensed(const Reference& r) const {
  const kinds::SensedCurrent sensed = kinds::sensed_current(deck_.circuit, r.name);
  if (sensed.problem.empty()) return;
  if (sensed.element == nullptr) {
    std::vector<std::string> names;
    for (const Element& e : deck_.circuit.elements()) {
      names.push_back(e.name);
      for (const auto& t : kinds::terminal_names(e.data)) names.push_back(e.name + "." + t);
    }
    r.file->source.fail(r.offset, sensed.problem + reader::suggestion(r.name, names));
  }
  const std::string hint =
      sensed.terminal.empty()
          ? ""
          : reader::suggestion(sensed.terminal, kinds::terminal_names(sensed.element->data));
  r.file->source.fail(r.offset, sensed.problem + hint);
}

void Elaborator::check_references() {
  for (const Reference& r : references_) {
    const auto fail_here = [&](const std::string& message) {
      r.file->source.fail(r.offset, message);
    };
    if (r.model_kind.empty()) {
      check_sensed(r);
      continue;
    }
    const auto model = models_.find(r.name);
    if (model == models_.end()) {
      std::vector<std::string> names;
      for (const auto& [name, entry] : models_) names.push_back(name);
      fail_here("no model named '" + r.name + "'" + reader::suggestion(r.name, names));
    }
    const std::string& wanted = r.model_kind;
    if (model->second.kind != wanted) {
      fail_here("'" + r.name + "' is a " + model->second.kind + " model; expected a " + wanted +
                " model");
    }
  }
}

}  // namespace stage::elaborate
