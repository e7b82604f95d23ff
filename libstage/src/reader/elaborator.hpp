// Elaboration: the syntax tree of a deck in, a flat stage::Circuit and its
// analysis statements out. Gives names their meaning (node, parameter, model,
// element, block by position), evaluates values with their units, expands
// block instances into hierarchical names (`x1/q`, `x1/mid`; `gnd` stays
// global), derives models, and checks every reference. Errors are
// InputErrors at the place in the text that caused them.
#pragma once

#include <map>
#include <optional>
#include <set>
#include <string>
#include <string_view>
#include <unordered_set>
#include <vector>

#include "circuit/element_kinds.hpp"
#include "reader/arguments.hpp"
#include "reader/expression.hpp"
#include "reader/loader.hpp"
#include "reader/syntax_tree.hpp"
#include "stage/reader.hpp"

namespace stage::elaborate {

// Elaborates a tree whose files are all loaded (Loader::load).
Deck elaborate(std::shared_ptr<const SyntaxTree> tree, const ReadOptions& options);

// Elaborates the tree's main file as it is parsed, statement by statement,
// opening includes through `loader` where they stand and adding their files,
// blocks and includes to the tree. Throws ReadCarefully where a block is used
// before its definition (that needs the whole deck loaded first).
Deck read(std::shared_ptr<SyntaxTree> tree, reader::Loader& loader, const ReadOptions& options);
struct ReadCarefully {};

class Elaborator {
 public:
  // With a `loader`, files are loaded as their includes are met (read());
  // without, the tree is complete (elaborate()).
  Elaborator(const SyntaxTree& tree, reader::Loader* loader, const ReadOptions& options,
             Deck& deck);
  void run();

 private:
  using File = SyntaxTree::File;

  // Where statements are being read: which file, inside which block instance.
  struct Frame {
    const File* file;
    std::string prefix;                        // "" or "x1/" or "x1/x2/"
    std::map<std::string, std::string> ports;  // port -> node outside
    reader::Scope* scope;
    std::vector<std::string> blocks;  // instantiation chain
  };

  struct ModelEntry {
    std::string kind;  // the language's model kind: npn, pnp, diode
    AnyModel parameters;
    // Parameters set explicitly (here or in a base model) and where.
    std::map<std::string, std::pair<const File*, int>> set;
  };

  // A reference checked once every statement is read (models and sensed
  // elements may be defined after their use).
  struct Reference {
    const File* file;
    int offset;
    std::string name;
    std::string model_kind;  // the model kind it must be; empty: a sensed element
  };

  // elaborator.cpp: the walk over statements.
  void collect_blocks(const File& file);
  void define_block(const File& file, const ast::Block& block);
  void file_statements(const File& file);
  void statements(const std::vector<ast::Statement>& list, const Frame& frame);
  void statement(const ast::Statement& statement, const Frame& frame);
  void let(const ast::Let& let, const Frame& frame, reader::Scope& scope);
  void solver(const ast::Solver& solver, const Frame& frame);
  reader::Value written_override(const std::string& name, const std::string& text,
                                 const reader::Value& replaced, const reader::Scope& scope) const;
  void instantiate_block(const ast::Instance& instance, const Frame& frame);
  // The elements an instance of `block` expands to, from the definitions
  // alone (so that a block that would make too many fails before it is
  // expanded), saturating just above the limit.
  std::size_t expanded_size(const std::string& block);
  void check_references();
  void check_sensed(const Reference& r) const;
  std::string node(const ast::Expr& e, const Frame& frame);
  std::string element_name(const std::string& local, const Frame& frame) const;
  // The keyword an element or block instance was written with ("resistor",
  // "npn", "block"), or nothing when there is none of that name.
  std::optional<std::string_view> kind_of(const std::string& name) const;
  // Every element and block instance name, sorted (for suggestions).
  std::vector<std::string> element_names() const;
  // Whether an element has the node (looked for only by analyses).
  bool has_node(const std::string& name) const;
  std::vector<std::string> node_names() const;
  [[noreturn]] void fail(const Frame& frame, int offset, const std::string& message) const;

  // elements.cpp: element statements, read through their kind's descriptor.
  void element(const ast::Instance& instance, const Frame& frame);
  template <class E>
  E read_element(const kinds::Descriptor<E>& kind, const kinds::Spelling<E>& spelling,
                 const ast::Instance& instance, const Frame& frame);
  std::pair<std::string, std::string> node_pair(const ast::Expr& e, int offset, const Frame& frame);
  Waveform waveform(const ast::Expr& e, Quantity level, const Frame& frame);  // waveforms.cpp
  double value(const BoundArguments& args, std::string_view name, Quantity q, const Frame& frame,
               double fallback = 0, bool allow_infinity = false);

  // model_statements.cpp: model statements, read through their kind's descriptor.
  void model(const ast::Model& model, const Frame& frame);
  template <class Model>
  void read_parameters(const kinds::ModelDescriptor<Model>& kind, const ast::Model& m,
                       ModelEntry& entry, const Frame& frame);

  // analysis_statements.cpp
  void analysis(const ast::Analyze& analyze, const File& file);
  SignalRef signal(const ast::Expr& e, const File& file) const;
  std::string existing_element(const ast::Expr& e, const File& file, bool source_only) const;

  const SyntaxTree& tree_;
  reader::Loader* loader_;
  const ReadOptions& options_;
  Deck& deck_;
  reader::Scope globals_;
  std::set<std::string> used_overrides_;
  std::map<std::string, std::pair<const File*, const ast::Block*>> blocks_;
  std::map<std::string, std::size_t> expanded_sizes_;  // memo of expanded_size()
  std::map<std::string, ModelEntry> models_;
  std::set<std::string> block_instances_;  // their hierarchical names
  std::set<std::string> port_nodes_;       // nodes given to block ports
  // Every node of the elements, made by the first analysis that names a
  // node (after the last element: the views point into the elements).
  mutable std::optional<std::unordered_set<std::string_view>> element_nodes_;
  std::vector<Reference> references_;
  std::vector<std::pair<const File*, ast::Analyze>> analyses_;  // read last
  bool have_title_ = false;
  // Room made so far in the circuit and its places (file by file).
  std::size_t room_ = 0;
  std::size_t room_name_bytes_ = 0;
};

}  // namespace stage::elaborate
