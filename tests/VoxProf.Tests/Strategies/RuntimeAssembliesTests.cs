using System.Text;
using Microsoft.Extensions.DependencyModel;
using VoxProf.Core.Strategies;

namespace VoxProf.Tests.Strategies;

public sealed class RuntimeAssembliesTests
{
    // A self-contained program's deps file as the .NET 10 SDK writes it (the runtime's files under a library of type
    // "runtimepack"), trimmed to a few files, read by the deps reader the host's own format comes with.
    private const string SelfContainedDeps = """
        {
          "runtimeTarget": { "name": ".NETCoreApp,Version=v10.0/linux-x64" },
          "targets": {
            ".NETCoreApp,Version=v10.0": {},
            ".NETCoreApp,Version=v10.0/linux-x64": {
              "voxprof/0.1.0": { "runtime": { "voxprof.dll": {} } },
              "runtimepack.Microsoft.NETCore.App.Runtime.linux-x64/10.0.12": {
                "runtime": { "System.Linq.dll": {}, "System.Private.CoreLib.dll": {}, "System.Runtime.dll": {} },
                "native": { "libclrjit.so": {} }
              },
              "SixLabors.ImageSharp/2.1.13": { "runtime": { "lib/net6.0/SixLabors.ImageSharp.dll": {} } },
              "VoxProf.Reports/0.1.0": { "runtime": { "VoxProf.Reports.dll": {} } }
            }
          },
          "libraries": {
            "voxprof/0.1.0": { "type": "project" },
            "runtimepack.Microsoft.NETCore.App.Runtime.linux-x64/10.0.12": { "type": "runtimepack" },
            "SixLabors.ImageSharp/2.1.13": { "type": "package" },
            "VoxProf.Reports/0.1.0": { "type": "project" }
          }
        }
        """;

    [Fact]
    public void A_self_contained_program_offers_its_runtime_pack_files_and_none_of_the_tools_libraries()
    {
        string[] trusted = ["/app/voxprof.dll", "/app/System.Linq.dll", "/app/System.Private.CoreLib.dll", "/app/System.Runtime.dll",
            "/app/SixLabors.ImageSharp.dll", "/app/VoxProf.Reports.dll"];
        // The runtime's folder is the program's own here, so the folder alone would let every library through.
        RuntimeAssemblies.Select(trusted, "/app/", Read(SelfContainedDeps)).Should()
            .Equal("/app/System.Linq.dll", "/app/System.Private.CoreLib.dll", "/app/System.Runtime.dll");
    }

    [Fact]
    public void A_framework_dependent_program_offers_what_lies_in_the_runtimes_folder()
    {
        string[] trusted = ["/usr/share/dotnet/shared/Microsoft.NETCore.App/10.0.12/System.Linq.dll", "/src/bin/VoxProf.Reports.dll",
            "/src/bin/SixLabors.ImageSharp.dll"];
        const string frameworkDependentDeps = """{ "targets": { ".NETCoreApp,Version=v10.0": { "a/1.0": { "runtime": { "a.dll": {} } } } }, "libraries": { "a/1.0": { "type": "project" } } }""";
        foreach (DependencyContext? deps in new[] { Read(frameworkDependentDeps), null })
        {
            RuntimeAssemblies.Select(trusted, "/usr/share/dotnet/shared/Microsoft.NETCore.App/10.0.12/", deps).Should()
                .Equal(["/usr/share/dotnet/shared/Microsoft.NETCore.App/10.0.12/System.Linq.dll"], $"deps file {(deps is null ? "absent" : "present")}");
        }
    }

    [Fact]
    public void This_test_process_offers_the_core_library_and_not_the_report_library()
    {
        IReadOnlyList<string> found = RuntimeAssemblies.OfProcess();
        found.Should().Contain(p => Path.GetFileName(p) == "System.Private.CoreLib.dll");
        found.Should().NotContain(p => Path.GetFileName(p).StartsWith("VoxProf", StringComparison.Ordinal));
        found.Should().NotContain(p => Path.GetFileName(p) == "SixLabors.ImageSharp.dll");
    }

    private static DependencyContext Read(string json)
    {
        using var reader = new DependencyContextJsonReader();
        return reader.Read(new MemoryStream(Encoding.UTF8.GetBytes(json)));
    }
}
