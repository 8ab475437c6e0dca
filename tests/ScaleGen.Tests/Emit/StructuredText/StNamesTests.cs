using ScaleGen.Emit.StructuredText;
using ScaleGen.Model;
using ScaleGen.Tests.Support;

namespace ScaleGen.Tests.Emit.StructuredText;

public class StNamesTests
{
    [Fact]
    public void Example_points_use_their_identifier_with_Raw_and_Par()
    {
        var plant = TestInputs.CompileExample().Plant;
        var names = StNames.ForPlant(plant);
        Assert.Equal(plant.Points.Length, names.Length);
        var lt = names.Single(n => n.Point.Tag == "LT-101");
        Assert.Equal(("LT_101", "LT_101_Raw", "LT_101_Par"), (lt.Instance, lt.RawInput, lt.Parameters));
    }

    [Fact]
    public void Names_never_collide_even_for_contrived_tags()
    {
        var compilation = TestInputs.Compile(TestInputs.StandardCard + """

            point A { card AI16 at "1"; range 0 .. 1 m }
            point a-raw { card AI16 at "2"; range 0 .. 1 m }
            point A-Par { card AI16 at "3"; range 0 .. 1 m }
            point SG-Plant { card AI16 at "4"; range 0 .. 1 m }
            point sg-ok { card AI16 at "5"; range 0 .. 1 m }
            """);
        Assert.False(compilation.HasErrors, string.Join("\n", compilation.Diagnostics));
        var names = StNames.ForPlant(compilation.Plant);
        var all = names.SelectMany(n => new[] { n.Instance, n.RawInput, n.Parameters }).Concat(StNames.LibraryNames).ToList();
        Assert.Equal(all.Count, all.Distinct(StringComparer.OrdinalIgnoreCase).Count());
        Assert.All(all, n => Assert.True(IecNames.IsWellFormed(n) && !IecNames.IsReserved(n), n));
        // Instances keep the point's identifier where it is free.
        Assert.Equal(["A", "a_raw", "A_Par", "SG_Plant_2", "sg_ok_2"], names.Select(n => n.Instance));
        Assert.Equal("A_Raw_2", names[0].RawInput);
        Assert.Equal("A_Par_2", names[0].Parameters);
    }

    [Fact]
    public void Library_declares_every_name_the_contract_lists()
    {
        var body = StLibrary.Body;
        foreach (var name in StNames.LibraryNames.Where(n => n != StNames.Program))
            Assert.Contains(name, body);
        foreach (var member in new[] { StNames.RawInput, StNames.CodeFaultInput, StNames.ParamsInput, StNames.ValueOutput, StNames.StatusOutput, StNames.FaultOutput })
            Assert.Matches($@"\n    {member} : ", body);
        foreach (var kind in StNames.AlarmKinds)
        {
            Assert.Matches($@"\n    {StNames.AlarmOutput(kind)} : BOOL;", body);
            Assert.Matches($@"\n    {StNames.AlarmParamsField(kind)} : {StNames.AlarmParamsType};", body);
        }
        // The enumeration lists the status values in the documented order.
        Assert.Contains("(" + string.Join(", ", StNames.StatusOrder.Select(StNames.StatusValue)) + ");", body);
    }
}
