// `cuspmap compare`: not built yet; refuses with exit 2 until its issue lands.
#include "cli/command.h"
#include "core/input_error.h"

namespace cuspmap {

void setup_compare(CLI::App& sub) {
  sub.allow_extras();
  sub.callback([] { throw InputError("'compare' is not built yet in this version of cuspmap"); });
}

}  // namespace cuspmap
