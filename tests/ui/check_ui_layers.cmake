# Fails when a file in one of ui's folders includes a file of a folder on its own level or above.
# The levels, lowest first (DEVELOPERS.md, "The window's layers"):
#   0  document text      the results store, the job runner, the workbook; wording and numbers
#   1  models charts      table models; charts and their data
#   2  panels export      the window's panels; files, pictures and the report
#   3  ui/ itself         the main window and its actions
# A folder may include its own files and those of lower levels only. Includes are read as written
# ("folder/file.h"); a bare "file.h" is a file of the same folder. Run as:
#   cmake -DDIR=<the ui folder> -P check_ui_layers.cmake
if(NOT DEFINED DIR OR NOT IS_DIRECTORY "${DIR}")
  message(FATAL_ERROR "check_ui_layers: DIR is not a folder: '${DIR}'")
endif()

set(level_document 0)
set(level_text 0)
set(level_models 1)
set(level_charts 1)
set(level_panels 2)
set(level_export 2)
set(folders document text models charts panels export)

set(found "")
set(count 0)
foreach(folder IN LISTS folders)
  if(NOT IS_DIRECTORY "${DIR}/${folder}")
    continue()
  endif()
  file(GLOB_RECURSE files "${DIR}/${folder}/*.h" "${DIR}/${folder}/*.cpp")
  foreach(f IN LISTS files)
    math(EXPR count "${count} + 1")
    file(STRINGS "${f}" lines REGEX "^[ \t]*#[ \t]*include[ \t]*\"")
    foreach(l IN LISTS lines)
      if(NOT l MATCHES "\"([^\"]+)\"")
        continue()
      endif()
      set(path "${CMAKE_MATCH_1}")
      if(path MATCHES "^tailwise/")
        continue() # core
      endif()
      if(path MATCHES "^([a-z]+)/")
        set(target "${CMAKE_MATCH_1}")
      elseif(EXISTS "${DIR}/${path}" AND NOT EXISTS "${DIR}/${folder}/${path}")
        set(target "ui") # mainwindow.h, actions.h: the top
      else()
        continue() # a file of the same folder
      endif()
      if(target STREQUAL folder)
        continue()
      endif()
      if(target STREQUAL "ui")
        set(to 3)
      elseif(DEFINED level_${target})
        set(to ${level_${target}})
      else()
        continue() # not one of ui's folders (a generated file, a test fixture)
      endif()
      if(to GREATER_EQUAL ${level_${folder}})
        string(STRIP "${l}" l)
        file(RELATIVE_PATH rel "${DIR}" "${f}")
        list(APPEND found "${rel}: ${l} (${folder} is level ${level_${folder}}, ${target} level ${to})")
      endif()
    endforeach()
  endforeach()
endforeach()
if(count EQUAL 0)
  message(FATAL_ERROR "check_ui_layers: no source files under ${DIR}")
endif()
if(found)
  list(JOIN found "\n  " text)
  message(FATAL_ERROR "An include runs sideways or upward between ui's layers:\n  ${text}")
endif()
message(STATUS "check_ui_layers: ${count} files under ${DIR}, every include runs downward")
