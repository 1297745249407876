# Installs headers, the library and a CMake package so that lab code can
#   find_package(nappe REQUIRED)  and  target_link_libraries(app PRIVATE nappe::nappe)
include(GNUInstallDirs)
include(CMakePackageConfigHelpers)

install(TARGETS nappe EXPORT nappeTargets
        LIBRARY DESTINATION ${CMAKE_INSTALL_LIBDIR}
        ARCHIVE DESTINATION ${CMAKE_INSTALL_LIBDIR}
        RUNTIME DESTINATION ${CMAKE_INSTALL_BINDIR})
install(DIRECTORY ${PROJECT_SOURCE_DIR}/include/nappe DESTINATION ${CMAKE_INSTALL_INCLUDEDIR})
install(DIRECTORY ${PROJECT_SOURCE_DIR}/share/ DESTINATION ${CMAKE_INSTALL_DATADIR}/nappe OPTIONAL)
install(PROGRAMS ${PROJECT_SOURCE_DIR}/scripts/plot_sweep.py ${PROJECT_SOURCE_DIR}/scripts/plot_case.py
                 ${PROJECT_SOURCE_DIR}/scripts/plot_limits.py ${PROJECT_SOURCE_DIR}/scripts/plot_electronics.py DESTINATION ${CMAKE_INSTALL_DATADIR}/nappe)
install(FILES ${PROJECT_SOURCE_DIR}/scripts/nappe_plotting.py ${PROJECT_SOURCE_DIR}/scripts/sweep_figures.py
        DESTINATION ${CMAKE_INSTALL_DATADIR}/nappe)

set(nappe_cmake_dir ${CMAKE_INSTALL_LIBDIR}/cmake/nappe)
install(EXPORT nappeTargets NAMESPACE nappe:: DESTINATION ${nappe_cmake_dir})
configure_package_config_file(${PROJECT_SOURCE_DIR}/cmake/nappeConfig.cmake.in
                              ${PROJECT_BINARY_DIR}/nappeConfig.cmake
                              INSTALL_DESTINATION ${nappe_cmake_dir})
write_basic_package_version_file(${PROJECT_BINARY_DIR}/nappeConfigVersion.cmake
                                 COMPATIBILITY SameMinorVersion)
install(FILES ${PROJECT_BINARY_DIR}/nappeConfig.cmake ${PROJECT_BINARY_DIR}/nappeConfigVersion.cmake
        DESTINATION ${nappe_cmake_dir})
