public class Smoke { [Fact] public void Runs() => Assert.True(true); }
