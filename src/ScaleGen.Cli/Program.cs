System.Console.WriteLine("scalegen");
