# The engine's layer rule, checked: a file under core/<module>/ may include files of its own
# module and of modules in LOWER layers only. Modules on one line are siblings and do not
# include each other. This list is the one place the order is written (DEVELOPERS.md draws it).
set(BARROW_CORE_LAYERS
  "base"                        # run control, status, parameters, number text, threads, exp
  "cloud"                       # the weighted point set
  "spatial"                     # k-d tree, nearest-neighbour batches
  "kernel density transport critic"  # pair sums, density estimators, OT solvers, critic networks
  "measures"                    # the Measure interface, every measure, the registry
  "families critic_check"       # θ ↦ A_θ · a trained critic against the exact W1
  "sweep"                       # sweeps, continuity findings
  "uncertainty"                 # resampling intervals, permutation test, value versus n, bands
  "io"                          # every file format
  "scenario report"             # generators and the demo · the self-contained HTML report
)

set(rank 0)
foreach(layer ${BARROW_CORE_LAYERS})
  string(REPLACE " " ";" modules "${layer}")
  foreach(module ${modules})
    set(rank_${module} ${rank})
  endforeach()
  math(EXPR rank "${rank} + 1")
endforeach()

file(GLOB_RECURSE files RELATIVE ${CORE_DIR} ${CORE_DIR}/*.h ${CORE_DIR}/*.cpp)
set(bad "")
foreach(f ${files})
  string(REGEX MATCH "^[^/]+" module "${f}")
  if(NOT DEFINED rank_${module})
    list(APPEND bad "core/${f}: module '${module}' has no layer in tests/check_core_layers.cmake")
    continue()
  endif()
  file(STRINGS ${CORE_DIR}/${f} lines REGEX "^[ \t]*#[ \t]*include[ \t]*\"[^\"]+\"")
  foreach(line ${lines})
    string(REGEX REPLACE ".*\"([^\"]+)\".*" "\\1" target "${line}")
    if(NOT target MATCHES "/")
      continue()  # a file beside this one
    endif()
    string(REGEX MATCH "^[^/]+" other "${target}")
    if(other STREQUAL module)
      continue()
    endif()
    if(NOT DEFINED rank_${other})
      list(APPEND bad "core/${f}: includes \"${target}\" (module '${other}' has no layer)")
    elseif(NOT rank_${other} LESS rank_${module})
      list(APPEND bad "core/${f}: includes \"${target}\" (${other} is not below ${module})")
    endif()
  endforeach()
endforeach()
if(bad)
  string(REPLACE ";" "\n" bad "${bad}")
  message(FATAL_ERROR "core/ breaks the layer order:\n${bad}")
endif()
list(LENGTH files n)
message(STATUS "core_layers: ${n} files checked, every include points to a lower layer")
