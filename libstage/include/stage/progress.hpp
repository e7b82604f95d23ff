// Progress of long work (sweeps, headroom searches): a callback told what is
// being done as it happens. The command shows it on a terminal only.
#pragma once

#include <functional>
#include <string>

namespace stage {

using ProgressCallback = std::function<void(const std::string& what)>;

}  // namespace stage
