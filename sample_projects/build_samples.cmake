# Rebuilds the sample projects (*.tledger) from their CSV sources with `tledger import`.
# The recipe below is the single list of what each project holds.
#
#   cmake -DTLEDGER=<tledger> -DSOURCE_DIR=<sample_projects> -DOUTPUT_DIR=<dir> -P build_samples.cmake
#   ... -DCHECK=ON : build into OUTPUT_DIR, then compare with the committed files in
#                    SOURCE_DIR (exported JSON without save timestamps); fail on any difference.
#
# (No semicolons in the texts below: CMake would split them into list items.)
# A scenario folder may be an overlay: with a BASE folder, the scenario's CSV files
# replace those of BASE, and the files it does not have are taken from BASE.
cmake_minimum_required(VERSION 3.25)
foreach(var TLEDGER SOURCE_DIR OUTPUT_DIR)
  if(NOT DEFINED ${var})
    message(FATAL_ERROR "build_samples.cmake: -D${var}=... is required")
  endif()
endforeach()

set(kInvented "All data in this project are invented for demonstration and describe no real water body. Model output supports, and does not replace, stock assessment, local regulation and licensed professional judgement.")

set(projects "")
function(copy_csv_files destination)
  foreach(f IN LISTS ARGN)
    get_filename_component(name "${f}" NAME)
    file(COPY_FILE "${f}" "${destination}/${name}")
  endforeach()
endfunction()

# sample(<project file> <scenario> <folder> <base folder or ""> <parent or ""> <description>)
function(sample project scenario folder base parent description)
  set(work "${WORK_DIR}/${project}/${scenario}")
  file(REMOVE_RECURSE "${work}")
  file(MAKE_DIRECTORY "${work}")
  if(base)
    file(GLOB base_files "${SOURCE_DIR}/${base}/*.csv")
    copy_csv_files("${work}" ${base_files})
  endif()
  file(GLOB own_files "${SOURCE_DIR}/${folder}/*.csv")
  if(NOT own_files)
    message(FATAL_ERROR "sample ${project} / ${scenario}: no CSV files in ${SOURCE_DIR}/${folder}")
  endif()
  # The overlay must win even when its files carry the base's timestamp (a fresh
  # clone): file(COPY) would skip them as "same time stamp", so copy one by one.
  copy_csv_files("${work}" ${own_files})
  set(target "${OUTPUT_DIR}/${project}.new")
  set(extra "")
  if(parent)
    list(APPEND extra --parent "${parent}")
  endif()
  if(NOT EXISTS "${target}")
    string(REPLACE ".tledger" "" stem "${project}")
    list(APPEND extra --title "${stem}" --notes "${kInvented}")
  endif()
  if(VERBOSE_SAMPLES)
    message(STATUS "${TLEDGER} import ${work} --into ${target} --scenario ${scenario} ${extra}")
  endif()
  execute_process(COMMAND "${TLEDGER}" import "${work}" --into "${target}" --scenario "${scenario}"
                          --description "${description}" ${extra}
                  RESULT_VARIABLE rc OUTPUT_VARIABLE out ERROR_VARIABLE err)
  if(NOT rc EQUAL 0)
    message(FATAL_ERROR "sample ${project} / ${scenario}: tledger import failed (${rc}):\n${err}")
  endif()
  set(projects "${projects};${project}" PARENT_SCOPE)
endfunction()

if(NOT DEFINED WORK_DIR)
  set(WORK_DIR "${OUTPUT_DIR}/_work")  # scratch: assembled overlay folders, exported JSON
endif()
file(MAKE_DIRECTORY "${OUTPUT_DIR}" "${WORK_DIR}")
foreach(p reservoir.tledger lagoon.tledger)
  file(REMOVE "${OUTPUT_DIR}/${p}.new" "${OUTPUT_DIR}/${p}.new-wal" "${OUTPUT_DIR}/${p}.new-shm")
endforeach()

# --- the recipe ---------------------------------------------------------------------
if(EXISTS "${SOURCE_DIR}/reservoir/compartments.csv")
  sample(reservoir.tledger "baseline" reservoir "" ""
         "Invented reservoir as its CSV folder describes it")
  sample(reservoir.tledger "doubled net effort" reservoir_scenarios/doubled_net_effort reservoir baseline
         "Gill-net fleet effort doubled: its landings and discards twice the baseline")
  sample(reservoir.tledger "invasive mussel" reservoir_scenarios/invasive_mussel reservoir baseline
         "An invented filter-feeding mussel established, with its diet and its predators")
else()
  message(WARNING "sample_projects/reservoir/ has no CSV yet; reservoir.tledger is not built")
endif()
sample(lagoon.tledger "baseline" lagoon "" ""
       "Invented brackish coastal lagoon with fyke nets, beach seines and clam rakes")
sample(lagoon.tledger "clam raking closed" lagoon_scenarios/clam_raking_closed "" baseline
       "Clam raking stopped and the eelgrass meadows recovered to 200 t/km² (invented)")

# --- move into place, or compare -------------------------------------------------------
list(REMOVE_DUPLICATES projects)
list(REMOVE_ITEM projects "")
function(exported_content file out_var)
  set(json "${WORK_DIR}/compare.json")
  file(REMOVE "${json}")
  execute_process(COMMAND "${TLEDGER}" export "${file}" --format json --out "${json}"
                  RESULT_VARIABLE rc ERROR_VARIABLE err OUTPUT_QUIET)
  if(NOT rc EQUAL 0)
    message(FATAL_ERROR "cannot export ${file} (${rc}):\n${err}")
  endif()
  file(READ "${json}" text)
  string(REGEX REPLACE "\"(created|modified|program_version)\": \"[^\"]*\",?" "" text "${text}")
  set(${out_var} "${text}" PARENT_SCOPE)
endfunction()

set(failed "")
foreach(p IN LISTS projects)
  if(CHECK)
    if(NOT EXISTS "${SOURCE_DIR}/${p}")
      list(APPEND failed "${p} (not committed)")
      continue()
    endif()
    exported_content("${OUTPUT_DIR}/${p}.new" fresh)
    exported_content("${SOURCE_DIR}/${p}" committed)
    if(NOT fresh STREQUAL committed)
      file(WRITE "${OUTPUT_DIR}/${p}.fresh.json" "${fresh}")
      file(WRITE "${OUTPUT_DIR}/${p}.committed.json" "${committed}")
      list(APPEND failed "${p}")
    endif()
  else()
    # Replace the file only when its content changed, so that a rebuild does not churn
    # committed binaries over their save timestamps.
    set(same FALSE)
    if(EXISTS "${OUTPUT_DIR}/${p}")
      exported_content("${OUTPUT_DIR}/${p}.new" fresh)
      exported_content("${OUTPUT_DIR}/${p}" current)
      if(fresh STREQUAL current)
        set(same TRUE)
      endif()
    endif()
    if(same)
      file(REMOVE "${OUTPUT_DIR}/${p}.new")
      message(STATUS "unchanged ${OUTPUT_DIR}/${p}")
    else()
      file(RENAME "${OUTPUT_DIR}/${p}.new" "${OUTPUT_DIR}/${p}")
      message(STATUS "rebuilt ${OUTPUT_DIR}/${p}")
    endif()
  endif()
endforeach()
file(REMOVE_RECURSE "${WORK_DIR}")
if(failed)
  message(FATAL_ERROR "sample projects differ from their CSV sources: ${failed}\n"
                      "(JSON of both left in ${OUTPUT_DIR}). Rebuild them with: ninja update_sample_projects")
endif()
